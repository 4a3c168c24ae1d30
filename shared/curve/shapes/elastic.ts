import { BINOMIAL, maxAbsSin, SAFETY } from '../extrema';
import { tpmt } from './expo';
import { DEFAULTS, type EaseFamily, type ShapeParams } from './family';

const K = 1.0009775171065494;
const L = 10 * Math.LN2;
const TAU = 2 * Math.PI;

/**
 * elastic (d3-ease 3.0.2 elasticIn): with a = max(1, amplitude), p = period/2π, σ = asin(1/a)·p,
 *   f(s) = E(s)·S(s),  E(s) = a·tpmt(1 − s),  S(s) = sin((σ + 1 − s)/p).
 * E^(j) = a·K·(10 ln 2)^j·2^(10(s−1)) for j ≥ 1 and S^(j) = (−1/p)^j·sin(θ + jπ/2), θ = (σ+1−s)/p.
 * Derivatives by Leibniz' rule f^(k) = Σ C(k,j) E^(j) S^(k−j); the bound applies the triangle
 * inequality term by term with the exact max of |E^(j)| (monotone, at an end) and of |sin| over
 * the phase interval (rigorous, a little loose).
 */
function amplitudeOf(params: ShapeParams): number {
  return Math.max(1, params?.amplitude ?? DEFAULTS.amplitude);
}
function periodOf(params: ShapeParams): number {
  return (params?.period ?? DEFAULTS.period) / TAU;
}

function eDerivative(a: number, s: number, j: number): number {
  return j === 0 ? a * tpmt(1 - s) : a * K * Math.pow(L, j) * Math.pow(2, 10 * (s - 1));
}

export const elastic: EaseFamily = {
  value(s, order, params) {
    const a = amplitudeOf(params);
    const p = periodOf(params);
    const sigma = Math.asin(1 / a) * p;
    if (order === 0) {
      const t = s - 1;
      return a * tpmt(-t) * Math.sin((sigma - t) / p);
    }
    const theta = (sigma + 1 - s) / p;
    let sum = 0;
    for (let j = 0; j <= order; j++) {
      const m = order - j;
      const sDer = Math.pow(-1 / p, m) * Math.sin(theta + (m * Math.PI) / 2);
      sum += BINOMIAL[order][j] * eDerivative(a, s, j) * sDer;
    }
    return sum;
  },
  bound(order, a0, b0, params) {
    const a = amplitudeOf(params);
    const p = periodOf(params);
    const sigma = Math.asin(1 / a) * p;
    const thLo = (sigma + 1 - b0) / p;
    const thHi = (sigma + 1 - a0) / p;
    let sum = 0;
    for (let j = 0; j <= order; j++) {
      const m = order - j;
      const eMax = Math.max(Math.abs(eDerivative(a, a0, j)), Math.abs(eDerivative(a, b0, j)));
      const sMax = Math.pow(1 / p, m) * maxAbsSin(thLo + (m * Math.PI) / 2, thHi + (m * Math.PI) / 2);
      sum += BINOMIAL[order][j] * eMax * sMax;
    }
    return sum * SAFETY;
  },
  breaks: [],
  inOutJoin: 2,
};
