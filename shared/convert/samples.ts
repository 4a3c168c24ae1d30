/**
 * Dense motion samples (time, value) from text: CSV or JSON.
 *
 * CSV: one sample per line, two columns "time, value"; the separator is the first of ',', ';' or tab
 * found on the first data line; an optional header line (first line whose cells are not numbers);
 * blank lines and lines starting with '#' are skipped; extra columns are an error.
 * JSON: [[t, v], …] or [{ "time": t, "value": v }, …].
 * Times must be finite and strictly increasing; values finite; at least 2 samples.
 * Errors name the line (and column) for CSV, or the array index for JSON.
 */

export interface Samples {
  times: Float64Array;
  values: Float64Array;
}

export type SamplesResult = { ok: true; samples: Samples } | { ok: false; error: string };

const NUM = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** Parse CSV or JSON text (JSON when the first non-blank character is '[' or '{'). */
export function parseSamples(text: string): SamplesResult {
  const first = text.trimStart()[0];
  return first === '[' || first === '{' ? parseSamplesJson(text) : parseSamplesCsv(text);
}

export function parseSamplesCsv(text: string): SamplesResult {
  const lines = text.split(/\r\n|\n|\r/);
  const t: number[] = [];
  const v: number[] = [];
  let sep: string | null = null;
  let sawData = false;
  for (let i = 0; i < lines.length; i++) {
    const lineNo = i + 1;
    const raw = lines[i];
    const line = raw.trim();
    if (line === '' || line.startsWith('#')) continue;
    if (sep === null) sep = line.includes('\t') ? '\t' : line.includes(';') ? ';' : line.includes(',') ? ',' : null;
    if (sep === null) return { ok: false, error: `line ${lineNo}: expected two columns "time,value" separated by ',', ';' or tab, got "${line}"` };
    const cells = raw.split(sep);
    const trimmed = cells.map((c) => c.trim());
    if (!sawData && trimmed.every((c) => !NUM.test(c))) {
      if (trimmed.length !== 2) return { ok: false, error: `line ${lineNo}: header has ${trimmed.length} columns, expected 2 (time, value)` };
      sawData = true; // header accepted; only the first line may be one
      continue;
    }
    sawData = true;
    if (trimmed.length !== 2) return { ok: false, error: `line ${lineNo}: expected 2 columns (time${sep === '\t' ? '<tab>' : sep}value), got ${trimmed.length}` };
    // column positions (1-based characters) for the messages
    const col = [1 + (raw.length - raw.trimStart().length), raw.indexOf(sep) + 2 + (cells[1].length - cells[1].trimStart().length)];
    const nums: number[] = [];
    for (let c = 0; c < 2; c++) {
      const cell = trimmed[c];
      const what = c === 0 ? 'time' : 'value';
      if (!NUM.test(cell)) return { ok: false, error: `line ${lineNo}, column ${col[c]}: ${what} "${cell}" is not a number` };
      const x = Number(cell);
      if (!Number.isFinite(x)) return { ok: false, error: `line ${lineNo}, column ${col[c]}: ${what} "${cell}" is not finite` };
      nums.push(x);
    }
    if (t.length > 0 && !(nums[0] > t[t.length - 1])) {
      return { ok: false, error: `line ${lineNo}, column ${col[0]}: time ${nums[0]} must be greater than the previous time ${t[t.length - 1]} (strictly increasing)` };
    }
    t.push(nums[0]);
    v.push(nums[1]);
  }
  if (t.length < 2) return { ok: false, error: `need at least 2 samples, found ${t.length}` };
  return { ok: true, samples: { times: Float64Array.from(t), values: Float64Array.from(v) } };
}

export function parseSamplesJson(text: string): SamplesResult {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    return { ok: false, error: `JSON: ${(e as Error).message}` };
  }
  if (!Array.isArray(data)) return { ok: false, error: 'JSON: expected an array of [time, value] pairs or {time, value} objects' };
  const t: number[] = [];
  const v: number[] = [];
  for (let i = 0; i < data.length; i++) {
    const item: unknown = data[i];
    let time: unknown;
    let value: unknown;
    if (Array.isArray(item)) {
      if (item.length !== 2) return { ok: false, error: `[${i}]: expected [time, value], got ${item.length} elements` };
      [time, value] = item;
    } else if (item && typeof item === 'object') {
      time = (item as Record<string, unknown>).time;
      value = (item as Record<string, unknown>).value;
    } else {
      return { ok: false, error: `[${i}]: expected [time, value] or {time, value}, got ${JSON.stringify(item)}` };
    }
    if (typeof time !== 'number' || !Number.isFinite(time)) return { ok: false, error: `[${i}].time: must be a finite number, got ${JSON.stringify(time)}` };
    if (typeof value !== 'number' || !Number.isFinite(value)) return { ok: false, error: `[${i}].value: must be a finite number, got ${JSON.stringify(value)}` };
    if (t.length > 0 && !(time > t[t.length - 1])) {
      return { ok: false, error: `[${i}].time: ${time} must be greater than the previous time ${t[t.length - 1]} (strictly increasing)` };
    }
    t.push(time);
    v.push(value);
  }
  if (t.length < 2) return { ok: false, error: `need at least 2 samples, found ${t.length}` };
  return { ok: true, samples: { times: Float64Array.from(t), values: Float64Array.from(v) } };
}
