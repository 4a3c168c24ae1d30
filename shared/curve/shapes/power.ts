import { falling, SAFETY } from '../extrema';
import type { EaseFamily } from './family';

/**
 * Power easing f(s) = s^e (d3-ease 3.0.2 quad e = 2, cubic e = 3, poly with exponent e for quart/quint).
 * f^(k)(s) = e!/(e−k)! · s^(e−k), zero for k > e; on s ≥ 0 every |f^(k)| is non-decreasing,
 * so the exact maximum over [a, b] is at b.
 */
export function powerFamily(e: number): EaseFamily {
  return {
    value(s, order) {
      if (order === 0) return e === 2 ? s * s : e === 3 ? s * s * s : Math.pow(s, e);
      if (order > e) return 0;
      return falling(e, order) * Math.pow(s, e - order);
    },
    bound(order, _a, b) {
      if (order > e) return 0;
      return falling(e, order) * Math.pow(b, e - order) * SAFETY;
    },
    breaks: [],
    // in-out: f''(1) = e(e−1) ≠ 0, so the second derivative jumps at ½ (e.g. cubic +12 → −12).
    inOutJoin: 2,
  };
}
