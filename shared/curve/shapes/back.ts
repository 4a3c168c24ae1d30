import { maxAbsCubic, SAFETY } from '../extrema';
import { DEFAULTS, type EaseFamily, type ShapeParams } from './family';

function overshoot(p: ShapeParams): number {
  return p?.overshoot ?? DEFAULTS.overshoot;
}

/**
 * back: f(s) = s²((σ + 1)s − σ) with overshoot σ (default 1.70158; d3-ease 3.0.2 backIn).
 * A cubic: f = (σ+1)s³ − σs², f' = 3(σ+1)s² − 2σs, f'' = 6(σ+1)s − 2σ, f''' = 6(σ+1), f'''' = 0.
 * Bounds are the exact max of |polynomial| over [a, b] (end points and critical points).
 */
export const back: EaseFamily = {
  value(s, order, p) {
    const q = overshoot(p);
    switch (order) {
      case 0: return s * s * (q * (s - 1) + s);
      case 1: return 3 * (q + 1) * s * s - 2 * q * s;
      case 2: return 6 * (q + 1) * s - 2 * q;
      case 3: return 6 * (q + 1);
      default: return 0;
    }
  },
  bound(order, a, b, p) {
    const q = overshoot(p);
    switch (order) {
      case 1: return maxAbsCubic(0, -2 * q, 3 * (q + 1), 0, a, b) * SAFETY;
      case 2: return maxAbsCubic(-2 * q, 6 * (q + 1), 0, 0, a, b) * SAFETY;
      case 3: return Math.abs(6 * (q + 1)) * SAFETY;
      default: return 0;
    }
  },
  breaks: [],
  inOutJoin: 2,
};
