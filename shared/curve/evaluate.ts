import { findSegment } from './find';
import type { PreparedCurve } from './prepare';
import { segmentValue } from './segment';
import type { OutsideRule } from './types';

/**
 * Evaluation at any time t, with the outside rules (P = end − start):
 *   clamp:  the end key's value (first key before, last key after); derivatives 0.
 *   extend: a line through the end key's value with the one-sided slope of the nearest segment
 *           of positive length at the domain end: hermite its key's out-/in-slope, linear its
 *           chord, step 0, shape Δv·f'(0 or 1)/h, bezier the CSS Easing extension (P0→P1, else
 *           P0→P2 before; P2→P3, else P1→P3 after). v(t) = v_end + slope·(t − t_end); f'' = 0.
 *   repeat: t' = start + ((t − start) mod P), the same curve again (a jump where v(end) ≠ v(start)).
 *   mirror: q = (t − start) mod 2P; t' = start + q if q ≤ P, else end − (q − P) (ping-pong);
 *           odd derivatives change sign in the reflected copies.
 * repeat and mirror with P = 0 behave as clamp. Inside the domain the curve is right-continuous;
 * at t = end the value is exactly the last key's value. A single key is a constant.
 */
function at(c: PreparedCurve, t: number, order: 0 | 1 | 2): number {
  const n = c.count;
  if (n === 0) return order === 0 ? NaN : 0;
  if (n === 1) return order === 0 ? c.values[0] : 0;
  const start = c.start;
  const end = c.end;
  let sign = 1;
  if (t < start || t > end) {
    const rule: OutsideRule = t < start ? c.before : c.after;
    const P = end - start;
    if (rule === 'clamp' || !(P > 0) || t !== t) {
      if (t !== t) return NaN;
      return order === 0 ? (t < start ? c.values[0] : c.values[n - 1]) : 0;
    }
    if (rule === 'extend') {
      const e = t < start ? c.extendBefore : c.extendAfter;
      if (order === 2) return 0;
      if (order === 1) return e.slope;
      return e.value + e.slope * (t - (t < start ? start : end));
    }
    if (rule === 'repeat') {
      const x = t - start;
      t = start + (x - P * Math.floor(x / P));
    } else {
      const x = t - start;
      const q = x - 2 * P * Math.floor(x / (2 * P));
      if (q <= P) t = start + q;
      else {
        t = end - (q - P);
        if (order === 1) sign = -1;
      }
    }
    if (t < start) t = start;
    else if (t > end) t = end;
  }
  if (order === 0 && t === end) return c.values[n - 1];
  const i = findSegment(c, t);
  return sign * segmentValue(c, i, t, order);
}

/** The curve's value at time t (seconds), outside rules applied. No allocation. */
export function evaluate(c: PreparedCurve, t: number): number {
  return at(c, t, 0);
}

/** The first or second time derivative at t (value units per s, per s²); right-hand at keys, left-hand at the end. */
export function evaluateDerivative(c: PreparedCurve, t: number, order: 1 | 2): number {
  return at(c, t, order);
}

/**
 * evaluate (order 0) or evaluateDerivative (1, 2) at every time, written into `out`
 * (allocated once if absent; it must hold times.length entries). No allocation in the loop.
 */
export function evaluateMany(
  c: PreparedCurve, times: ArrayLike<number>, out?: Float64Array, order: 0 | 1 | 2 = 0,
): Float64Array {
  const n = times.length;
  const dst = out ?? new Float64Array(n);
  if (dst.length < n) throw new RangeError(`evaluateMany: out holds ${dst.length} entries, times has ${n}`);
  for (let k = 0; k < n; k++) dst[k] = at(c, times[k], order);
  return dst;
}
