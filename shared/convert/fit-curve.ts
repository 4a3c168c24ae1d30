/**
 * Key reduction applied to curve documents:
 * - `fitResultToCurve`: the keys of a sample fit (./fit.ts) as a curve document of hermite segments.
 * - `fitCurve`: replace every `bezier` and `shape` segment of a curve by hermite keys within a
 *   tolerance, so the animator can edit it with keys and slopes; step/linear/hermite stay exact.
 *
 * fitCurve, per converted segment [t_i, t_{i+1}]: the segment is cut at its shape's interior breaks
 * (e.g. bounce's kinks, from shapeBreakDetails), each piece is sampled at 1025 evenly spaced times
 * with segmentValue, fitted by fitSamples with the end values held exactly, then checked densely
 * against the source (8 points in every sample gap, plus the samples). If that check exceeds the
 * tolerance the piece is refitted at half the working tolerance (at most 6 times). Every key of the
 * result has rule `manual` with the source's resolved slopes, so inserting keys cannot move them.
 */
import {
  KIND_BEZIER, KIND_SHAPE, MAX_KEYS, segmentValue, shapeBreakDetails,
  type CurveDocument, type Key, type PreparedCurve, type Segment,
} from '../curve';
import { fitSamples, type FitKey, type FitResult } from './fit';

const SAMPLES_PER_PIECE = 1025;
const CHECKS_PER_GAP = 8;

/** A hermite curve document from fitted keys (joined slopes, manual rule, clamp outside). */
export function fitResultToCurve(fit: Pick<FitResult, 'keys'>, meta: Partial<Pick<CurveDocument, 'name' | 'description' | 'units' | 'drives' | 'tags' | 'frameRate'>> = {}): CurveDocument {
  const keys: Key[] = fit.keys.map((k) => ({ time: k.time, value: k.value, slopeIn: k.slope, slopeOut: k.slope, rule: 'manual', slopes: 'joined' }));
  return {
    format: 'tangentry.curve',
    version: 1,
    name: meta.name ?? 'fitted',
    ...(meta.description !== undefined ? { description: meta.description } : {}),
    units: meta.units ?? { time: 's', value: '' },
    before: 'clamp',
    after: 'clamp',
    frameRate: meta.frameRate ?? 60,
    drives: meta.drives ?? 'other',
    tags: meta.tags ?? ['fitted'],
    keys,
    segments: keys.slice(1).map(() => ({ kind: 'hermite' as const })),
  };
}

export interface FitCurveResult {
  doc: CurveDocument;
  /** Indexes (in the source) of the segments that were converted. */
  converted: number[];
  /** Keys added inside converted segments. */
  keysAdded: number;
  /** Largest |result − source| found by the dense check over converted segments (0 if none). */
  maxError: number;
  ok: boolean;
  tolerance: number;
}

/** Hermite value of fitted keys at t (t inside [keys[0].time, keys[last].time]). */
function fittedAt(keys: readonly FitKey[], t: number, hint: { k: number }): number {
  let k = hint.k;
  while (k < keys.length - 2 && t >= keys[k + 1].time) k++;
  while (k > 0 && t < keys[k].time) k--;
  hint.k = k;
  const a = keys[k];
  const b = keys[k + 1];
  const h = b.time - a.time;
  const s = (t - a.time) / h;
  const s2 = s * s;
  const s3 = s2 * s;
  return (2 * s3 - 3 * s2 + 1) * a.value + h * (s3 - 2 * s2 + s) * a.slope + (-2 * s3 + 3 * s2) * b.value + h * (s3 - s2) * b.slope;
}

/** Fit one smooth piece [p, q] of segment i; returns its keys (first and last at p and q) and the checked error. */
function fitPiece(c: PreparedCurve, i: number, p: number, q: number, tolerance: number): { keys: FitKey[]; error: number } {
  const n = SAMPLES_PER_PIECE;
  const t = new Float64Array(n);
  const y = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    t[j] = j === n - 1 ? q : p + ((q - p) * j) / (n - 1);
    y[j] = segmentValue(c, i, t[j]);
  }
  let working = 0.9 * tolerance;
  let best: { keys: FitKey[]; error: number } | null = null;
  for (let attempt = 0; attempt < 7; attempt++) {
    const fit = fitSamples(t, y, working, { fixStartValue: y[0], fixEndValue: y[n - 1] });
    let err = 0;
    const hint = { k: 0 };
    for (let j = 0; j < n; j++) {
      for (let m = 0; m < (j + 1 < n ? CHECKS_PER_GAP : 1); m++) {
        const x = m === 0 ? t[j] : t[j] + ((t[j + 1] - t[j]) * m) / CHECKS_PER_GAP;
        const e = Math.abs(fittedAt(fit.keys, x, hint) - segmentValue(c, i, x));
        if (e > err) err = e;
      }
    }
    if (!best || err < best.error) best = { keys: fit.keys, error: err };
    if (err <= tolerance) return { keys: fit.keys, error: err };
    working *= 0.5;
  }
  return best as { keys: FitKey[]; error: number };
}

/**
 * Convert the bezier and shape segments of `source` to hermite keys within `tolerance` (absolute,
 * value units). `only` limits the conversion to the listed segment indexes.
 */
export function fitCurve(source: PreparedCurve, tolerance: number, only?: readonly number[]): FitCurveResult {
  if (!(tolerance > 0) || !Number.isFinite(tolerance)) throw new Error(`tolerance: must be a positive finite number, got ${tolerance}`);
  const c = source;
  const doc = c.doc;
  const keys: Key[] = [];
  const segments: Segment[] = [];
  const converted: number[] = [];
  let maxError = 0;
  let keysAdded = 0;
  const srcKey = (k: number): Key => ({
    time: c.times[k], value: c.values[k], slopeIn: c.slopesIn[k], slopeOut: c.slopesOut[k],
    rule: 'manual', slopes: c.slopesIn[k] === c.slopesOut[k] ? 'joined' : 'split',
  });
  keys.push(srcKey(0));
  for (let i = 0; i + 1 < c.count; i++) {
    const kind = c.kinds[i];
    const t0 = c.times[i];
    const t1 = c.times[i + 1];
    const wanted = (kind === KIND_BEZIER || kind === KIND_SHAPE) && t1 > t0 && (!only || only.includes(i));
    if (!wanted) {
      segments.push({ ...doc.segments[i] });
      keys.push(srcKey(i + 1));
      continue;
    }
    converted.push(i);
    const cuts = [t0];
    const shape = c.shapes[i];
    if (kind === KIND_SHAPE && shape) {
      for (const b of shapeBreakDetails(shape)) if (b.s > 0 && b.s < 1) cuts.push(t0 + b.s * (t1 - t0));
    }
    cuts.push(t1);
    const pieceKeys: FitKey[] = [];
    for (let pI = 0; pI + 1 < cuts.length; pI++) {
      const { keys: fk, error } = fitPiece(c, i, cuts[pI], cuts[pI + 1], tolerance);
      maxError = Math.max(maxError, error);
      if (pieceKeys.length > 0) {
        // join at a break: the earlier piece's last key gives the in-slope, this piece's first the out-slope
        const last = pieceKeys[pieceKeys.length - 1] as FitKey & { slopeOut?: number };
        last.slopeOut = fk[0].slope;
        pieceKeys.push(...fk.slice(1));
      } else pieceKeys.push(...fk);
    }
    // first fitted key is key i (keep its value and slopeIn; its slopeOut becomes the fit's)
    const ki = keys[keys.length - 1];
    ki.slopeOut = pieceKeys[0].slope;
    ki.slopes = ki.slopeIn === ki.slopeOut ? 'joined' : 'split';
    for (let m = 1; m < pieceKeys.length; m++) {
      const fk = pieceKeys[m] as FitKey & { slopeOut?: number };
      segments.push({ kind: 'hermite' });
      if (m === pieceKeys.length - 1) {
        const end = srcKey(i + 1);
        end.slopeIn = fk.slope;
        end.slopes = end.slopeIn === end.slopeOut ? 'joined' : 'split';
        keys.push(end);
      } else {
        const out = fk.slopeOut ?? fk.slope;
        keys.push({ time: fk.time, value: fk.value, slopeIn: fk.slope, slopeOut: out, rule: 'manual', slopes: out === fk.slope ? 'joined' : 'split' });
        keysAdded++;
      }
    }
  }
  if (keys.length > MAX_KEYS) throw new Error(`fitCurve: the result needs ${keys.length} keys, more than the limit of ${MAX_KEYS}; use a larger tolerance`);
  return {
    doc: { ...doc, keys, segments },
    converted,
    keysAdded,
    maxError,
    ok: maxError <= tolerance,
    tolerance,
  };
}
