import { bernstein } from './bezier';
import { KIND_BEZIER, KIND_SHAPE, KIND_STEP, type PreparedCurve } from './prepare';
import { segmentValue } from './segment';
import { shapeBreakDetails, shapeValue } from './shapes';

/** A time where the curve is not smooth: `order` is the lowest derivative (0 = value) that jumps or is infinite. */
export interface CurveBreak {
  time: number;
  /** true when the value itself jumps (order 0). */
  jump: boolean;
  order: number;
}

/** Left limit (value) of segment i at its end, exact where the kind fixes it. */
function leftValue(c: PreparedCurve, i: number): number {
  const kind = c.kinds[i];
  if (kind === KIND_STEP) return c.values[i];
  if (kind === KIND_SHAPE) {
    const shape = c.shapes[i];
    const h = c.times[i + 1] - c.times[i];
    if (shape) return c.values[i] + (c.values[i + 1] - c.values[i]) * shapeValue(shape, 1, 0, h);
  }
  return c.values[i + 1];
}

/** Right value of segment i at its start. */
function rightValue(c: PreparedCurve, i: number): number {
  if (c.kinds[i] === KIND_SHAPE) {
    const shape = c.shapes[i];
    const h = c.times[i + 1] - c.times[i];
    if (shape) return c.values[i] + (c.values[i + 1] - c.values[i]) * shapeValue(shape, 0, 0, h);
  }
  return c.values[i];
}

/**
 * Every time in the domain where the curve is not C⁴, sorted: at each interior key time the
 * left segment's limits (value and derivatives 1..4) are compared with the right segment's
 * (a zero-length jump segment is skipped over); values differ when |Δ| > 1e-12·(1 + value range),
 * derivatives of order k when |Δ| > 1e-9·max(|left|, |right|) + 1e-12·range/h_min^k (a cautious
 * test: it may list a join that is smooth up to rounding, never misses a real one). Also listed:
 * shapes' inner breaks (bounce joints, in-out joins), bezier interior vertical tangents (order 1)
 * and the end time when the last segment's left limit differs from the last key's value (an
 * unsettled spring). The Hermite/linear error bounds hold only between consecutive breaks.
 */
export function curveBreaks(c: PreparedCurve): CurveBreak[] {
  const out: CurveBreak[] = [];
  const n = c.count;
  if (n < 2) return out;
  const t = c.times;
  let lo = Infinity, hi = -Infinity;
  for (let i = 0; i < n; i++) { lo = Math.min(lo, c.values[i]); hi = Math.max(hi, c.values[i]); }
  const range = hi - lo;
  const valueTol = 1e-12 * (1 + range);
  // positive-length segments in order
  const segs: number[] = [];
  for (let i = 0; i + 1 < n; i++) if (t[i + 1] > t[i]) segs.push(i);
  for (let j = 0; j < segs.length; j++) {
    const i = segs[j];
    const h = t[i + 1] - t[i];
    const shape = c.kinds[i] === KIND_SHAPE ? c.shapes[i] : null;
    if (shape) for (const b of shapeBreakDetails(shape)) out.push({ time: t[i] + b.s * h, jump: b.order === 0, order: b.order });
    if (c.kinds[i] === KIND_BEZIER) {
      const x1 = c.bez[6 * i], x2 = c.bez[6 * i + 1];
      const bb = 3 * (x2 - 2 * x1);
      const aa = 1 - 3 * x1 - bb;
      if (aa !== 0) {
        const v = -bb / (3 * aa);
        if (v > 0 && v < 1 && bernstein(0, x1, x2, 1, v, 1) <= 1e-14) {
          out.push({ time: t[i] + bernstein(0, x1, x2, 1, v, 0) * h, jump: false, order: 1 });
        }
      }
    }
    if (j + 1 < segs.length) {
      const r = segs[j + 1];
      const time = t[r];
      const hmin = Math.min(h, t[r + 1] - t[r]);
      let order = -1;
      if (Math.abs(leftValue(c, i) - rightValue(c, r)) > valueTol) order = 0;
      else {
        for (let k = 1 as 1 | 2 | 3 | 4; k <= 4; k = (k + 1) as 1 | 2 | 3 | 4) {
          const dl = segmentValue(c, i, time, k);
          const dr = segmentValue(c, r, time, k);
          const tol = 1e-9 * Math.max(Math.abs(dl), Math.abs(dr)) + (1e-12 * range) / Math.pow(hmin, k);
          if (!Number.isFinite(dl) || !Number.isFinite(dr) || Math.abs(dl - dr) > tol) { order = k; break; }
        }
      }
      if (order >= 0) out.push({ time, jump: order === 0, order });
    } else if (Math.abs(leftValue(c, i) - c.values[n - 1]) > valueTol) {
      out.push({ time: t[n - 1], jump: true, order: 0 });
    }
  }
  out.sort((a, b) => a.time - b.time);
  return out;
}
