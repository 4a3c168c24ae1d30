/**
 * The a-priori error bound of a table, from the interpolation remainders (Burden & Faires,
 * Numerical Analysis §3.1 and §3.4; de Boor, A Practical Guide to Splines — from memory):
 *   linear on an interval of width h:         |f − p| ≤ M2·h²/8,   M2 = max |f''|  (f ∈ W²,∞ there)
 *   cubic Hermite with exact end slopes:       |f − p| ≤ M4·h⁴/384, M4 = max |f''''| (f ∈ C³, f'''' bounded)
 * plus the encoding's round-off: the value basis functions of both kernels are ≥ 0 and sum to 1, so value
 * round-off ε_v passes through unchanged; the Hermite slope basis satisfies |h10| + |h11| = s(1 − s) ≤ 1/4,
 * so slope round-off ε_m adds at most H·ε_m/4.
 * The bound applies only where the source is smooth enough across the interval: no jump or slope break
 * inside (linear), nothing less smooth than C³ inside (hermite). Otherwise there is no a-priori bound (null).
 */
import type { BakeSource } from './source';
import type { Break } from './breaks';
import type { Kernel } from './profile';
import { nextDownF32, nextUpF32 } from './encoding';

/** M2·h²/8 (linear) or M4·h⁴/384 (hermite). */
export function interpolationBound(kernel: Kernel, M: number, h: number): number {
  return kernel === 'linear' ? (M * h * h) / 8 : (M * h * h * h * h) / 384;
}

/** Derivative order the kernel's remainder uses: 2 (linear) or 4 (hermite). */
export function boundOrder(kernel: Kernel): 2 | 4 {
  return kernel === 'linear' ? 2 : 4;
}

/** Largest interval width h with interpolationBound(kernel, M, h) ≤ tol (Infinity when M = 0). */
export function widthForTolerance(kernel: Kernel, M: number, tol: number): number {
  if (!(M > 0)) return Infinity;
  return kernel === 'linear' ? Math.sqrt((8 * tol) / M) : Math.pow((384 * tol) / M, 0.25);
}

/** max over the source segments overlapping [a, b] of bound(i, order, ·). */
export function derivativeBound(src: BakeSource, order: number, a: number, b: number): number {
  const S = src.times;
  let M = 0;
  for (let i = 0; i < S.length - 1; i++) {
    const lo = Math.max(a, S[i]), hi = Math.min(b, S[i + 1]);
    if (!(hi > lo)) continue;
    const m = src.bound(i, order, lo, hi);
    if (!(m >= 0)) return Infinity;
    if (m > M) M = m;
  }
  return M;
}

/**
 * A-priori bound of a table with knot times K (decoded), given the encoding round-off of its values
 * (epsV) and slopes (epsM). `oneSided` says the knot values/slopes at a break are the one-sided ones
 * (adaptive); uniform tables take one value and one slope there, so a break at a knot voids the bound.
 */
export function aprioriBound(
  src: BakeSource, kernel: Kernel, K: Float64Array, breaks: readonly Break[], epsV: number, epsM: number, oneSided: boolean,
): number | null {
  const limit = kernel === 'linear' ? 1 : 3;
  let worst = 0;
  let b = 0;
  for (let k = 0; k + 1 < K.length; k++) {
    const a0 = K[k], a1 = K[k + 1];
    if (!(a1 > a0)) continue;
    while (b < breaks.length && breaks[b].time < a0 && nextUpF32(breaks[b].time) < a0) b++;
    for (let j = b; j < breaks.length && breaks[j].time <= a1; j++) {
      const br = breaks[j];
      if (br.order > limit) continue;
      const inside = br.time > nextUpF32(a0) && br.time < nextDownF32(a1);
      if (inside) return null;
      if (!oneSided && (br.order === 0 || (br.order === 1 && kernel === 'hermite'))) return null;
    }
    const h = a1 - a0;
    const M = derivativeBound(src, boundOrder(kernel), a0, a1);
    if (!Number.isFinite(M)) return null;
    const e = interpolationBound(kernel, M, h) + epsV + (kernel === 'hermite' ? (h * epsM) / 4 : 0);
    if (!(e <= worst)) worst = e; // NaN counts as +Infinity
  }
  return Number.isFinite(worst) ? worst : null;
}
