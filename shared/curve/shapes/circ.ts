import { SAFETY } from '../extrema';
import type { EaseFamily } from './family';

/**
 * circ: f(s) = 1 − √(1 − s²) (d3-ease 3.0.2 circleIn). With g = √(1 − s²):
 *   f' = s/g,  f'' = 1/g³,  f''' = 3s/g⁵,  f'''' = 3(1 + 4s²)/g⁷.
 * All are non-negative and increasing on [0, 1), so the exact max over [a, b] is at b;
 * they are infinite at s = 1 (a vertical tangent: in-out has it at ½, out at 0).
 */
export const circ: EaseFamily = {
  value(s, order) {
    if (order === 0) return 1 - Math.sqrt(1 - s * s);
    return derivative(s, order);
  },
  bound(order, _a, b) {
    return derivative(b, order) * SAFETY;
  },
  breaks: [],
  // f'(1) is infinite, so in-out has an infinite slope at ½.
  inOutJoin: 1,
};

function derivative(s: number, order: number): number {
  const g2 = 1 - s * s;
  if (g2 <= 0) return Infinity;
  const g = Math.sqrt(g2);
  switch (order) {
    case 1: return s / g;
    case 2: return 1 / (g2 * g);
    case 3: return (3 * s) / (g2 * g2 * g);
    default: return (3 * (1 + 4 * s * s)) / (g2 * g2 * g2 * g);
  }
}
