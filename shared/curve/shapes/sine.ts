import { maxAbsSin, SAFETY } from '../extrema';
import type { EaseFamily } from './family';

const HALF_PI = Math.PI / 2;

/**
 * sine: f(s) = 1 − cos(πs/2) (d3-ease 3.0.2 sinIn; f(1) is exactly 1 as d3 does).
 * f^(k)(s) = −(π/2)^k · cos(πs/2 + kπ/2), so |f^(k)| ≤ (π/2)^k · max |cos| over the
 * phase interval, computed exactly by maxAbsSin(x + π/2). The in-out form is
 * (1 − cos πs)/2, analytic at ½ (no break); its max |f''''| on [0,1] is π⁴/2.
 */
export const sine: EaseFamily = {
  value(s, order) {
    if (order === 0) return s === 1 ? 1 : 1 - Math.cos(s * HALF_PI);
    return -Math.pow(HALF_PI, order) * Math.cos(s * HALF_PI + order * HALF_PI);
  },
  bound(order, a, b) {
    const shift = (order + 1) * HALF_PI; // |cos(x + kπ/2)| = |sin(x + (k+1)π/2)|
    return Math.pow(HALF_PI, order) * maxAbsSin(a * HALF_PI + shift, b * HALF_PI + shift) * SAFETY;
  },
  breaks: [],
  inOutJoin: 5,
};
