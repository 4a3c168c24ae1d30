import { SAFETY } from '../extrema';
import type { EaseFamily } from './family';

/** d3-ease 3.0.2 `tpmt`: (2^(−10x) − 2^(−10)) · 1024/1023, so tpmt(0) = 1 and tpmt(1) = 0. */
export function tpmt(x: number): number {
  return (Math.pow(2, -10 * x) - 0.0009765625) * 1.0009775171065494;
}

const K = 1.0009775171065494;
const L = 10 * Math.LN2;

/**
 * expo: f(s) = tpmt(1 − s) (d3-ease 3.0.2 expIn). For k ≥ 1,
 * f^(k)(s) = K·(10 ln 2)^k · 2^(10(s−1)), positive and increasing, so the exact max is at b.
 */
export const expo: EaseFamily = {
  value(s, order) {
    if (order === 0) return tpmt(1 - s);
    return K * Math.pow(L, order) * Math.pow(2, 10 * (s - 1));
  },
  bound(order, _a, b) {
    return K * Math.pow(L, order) * Math.pow(2, 10 * (b - 1)) * SAFETY;
  },
  breaks: [],
  inOutJoin: 2,
};
