import { SAFETY } from '../extrema';
import type { EaseFamily } from './family';

// d3-ease 3.0.2 bounce constants.
const b1 = 4 / 11, b2 = 6 / 11, b3 = 8 / 11, b4 = 3 / 4, b5 = 9 / 11, b6 = 10 / 11,
  b7 = 15 / 16, b8 = 21 / 22, b9 = 63 / 64, b0 = 1 / b1 / b1;

/** d3-ease 3.0.2 bounceOut: four parabolas b0·(t − c)² + d joined at 4/11, 8/11, 10/11. */
export function bounceOut(t: number): number {
  return t < b1 ? b0 * t * t : t < b3 ? b0 * (t -= b2) * t + b4 : t < b6 ? b0 * (t -= b5) * t + b7 : b0 * (t -= b8) * t + b9;
}

/** The centre c of the parabola d3 uses at t. */
function centre(t: number): number {
  return t < b1 ? 0 : t < b3 ? b2 : t < b6 ? b5 : b8;
}

const JOINTS = [b1, b3, b6];
const CENTRES = [0, b2, b5, b8];

/**
 * bounce: f(s) = 1 − bounceOut(1 − s) (d3-ease 3.0.2 bounceIn). On each parabola
 * f'(s) = 2b0·(t − c) and f''(s) = −2b0 with t = 1 − s; f''' = f'''' = 0. The slope
 * jumps at the joints s = 1/11, 3/11, 7/11 (order-1 breaks; at a joint the piece d3
 * selects gives the value). Order-1 bound: exact max of |2b0(t − c)| over the pieces met.
 */
export const bounce: EaseFamily = {
  value(s, order) {
    if (order === 0) return 1 - bounceOut(1 - s);
    const t = 1 - s;
    if (order === 1) return 2 * b0 * (t - centre(t));
    if (order === 2) return -2 * b0;
    return 0;
  },
  bound(order, a, b) {
    if (order >= 3) return 0;
    if (order === 2) return 2 * b0 * SAFETY;
    const t0 = 1 - b, t1 = 1 - a;
    let m = 0;
    const edges = [0, b1, b3, b6, 1];
    for (let k = 0; k < 4; k++) {
      const lo = Math.max(t0, edges[k]);
      const hi = Math.min(t1, edges[k + 1]);
      if (lo > hi) continue;
      const c = CENTRES[k];
      m = Math.max(m, Math.abs(2 * b0 * (lo - c)), Math.abs(2 * b0 * (hi - c)));
    }
    return m * SAFETY;
  },
  breaks: JOINTS.map((j) => ({ s: 1 - j, order: 1 })).sort((x, y) => x.s - y.s),
  inOutJoin: 2,
};
