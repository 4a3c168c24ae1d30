/**
 * Key-card edits, validated with the shared schema before they are applied: the edited document is
 * checked with parseCurveDocument and every issue is filed under the card field its path names
 * (keys[i].time → "time", segments[i].shape.params.period → "period", segments[i].bezier.h1.time →
 * "h1.time"). Pure.
 */
import { parseCurveDocument, type CurveDocument } from '../../../../shared/curve';
import { settle } from '../store/edits';

export type FieldErrors = Record<string, string>;

export type EditCheck = { ok: true; doc: CurveDocument } | { ok: false; errors: FieldErrors };

/** The field a schema path belongs to, for key i, or "other". */
export function fieldOf(path: string, i: number): string {
  const k = `keys[${i}].`;
  const s = `segments[${i}]`;
  if (path.startsWith(k)) return path.slice(k.length);
  if (path.startsWith(`${s}.shape.params.`)) return path.slice(`${s}.shape.params.`.length);
  // a handle's own field (h1.time, h2.value) when the path names one, else the segment's bezier as a whole
  const handle = /^\.bezier\.(h[12])\.(time|value)$/.exec(path.slice(s.length));
  if (handle) return `${handle[1]}.${handle[2]}`;
  if (path.startsWith(`${s}.bezier`)) return 'bezier';
  if (path.startsWith(`${s}.shape`)) return 'shape';
  if (path.startsWith(s)) return 'kind';
  if (path.startsWith(`keys[${i + 1}].time`)) return 'time';
  return 'other';
}

/** Strip the "keys[3].time: " prefix the schema puts on messages; the card shows them beside the field. */
function bare(message: string, path: string): string {
  return message.startsWith(`${path}: `) ? message.slice(path.length + 2) : message;
}

export function checkEdit(candidate: CurveDocument, i: number): EditCheck {
  const r = parseCurveDocument(candidate);
  if (r.ok) return { ok: true, doc: settle(candidate) };
  const errors: FieldErrors = {};
  for (const iss of r.issues) {
    const f = fieldOf(iss.path, i);
    // the schema checks order on the later key; seen from the edited key it is "after the next key"
    const msg = iss.path === `keys[${i + 1}].time`
      ? `time must not be after the next key's time (${candidate.keys[i + 1].time} s)`
      : bare(iss.message, iss.path);
    if (!errors[f]) errors[f] = msg;
  }
  return { ok: false, errors };
}

/** A number typed into a field: finite, or an error message naming the field. */
export function parseNumberField(text: string, field: string): { ok: true; value: number } | { ok: false; error: string } {
  const t = text.trim().replace(',', '.');
  if (t === '') return { ok: false, error: `${field} is required` };
  const v = Number(t);
  if (!Number.isFinite(v)) return { ok: false, error: `${field} must be a finite number` };
  return { ok: true, value: v };
}
