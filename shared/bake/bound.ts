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

/** Intervals aprioriBound bounds together first (./bound.ts). */
const CHUNK = 16;

/**
 * A-priori bound of a table with knot times K (decoded), given the encoding round-off of its values
 * (epsV) and slopes (epsM). `oneSided` says the knot values/slopes at a break are the one-sided ones
 * (adaptive); uniform tables take one value and one slope there, so a break at a knot voids the bound.
 *
 * The bound is the largest over the intervals. Runs of CHUNK intervals are bounded first as a whole
 * (the derivative bound over the run's span and its widest interval bound every interval in it); runs
 * are then taken largest first, each interval bounded on its own, until a run's bound is at most the
 * largest interval bound found: no interval of it or of the runs after it can raise the result.
 */
export function aprioriBound(
  src: BakeSource, kernel: Kernel, K: Float64Array, breaks: readonly Break[], epsV: number, epsM: number, oneSided: boolean,
): number | null {
  const limit = kernel === 'linear' ? 1 : 3;
  const order = boundOrder(kernel);
  const remainder = (M: number, h: number): number => interpolationBound(kernel, M, h) + epsV + (kernel === 'hermite' ? (h * epsM) / 4 : 0);
  // a break inside an interval (or, for one value and slope per entry, on a knot) voids the bound
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
  }
  const intervals = K.length - 1, runs = Math.ceil(intervals / CHUNK);
  const runBound = new Float64Array(runs);
  for (let r = 0; r < runs; r++) {
    const k0 = r * CHUNK, k1 = Math.min(intervals, k0 + CHUNK);
    let hmax = 0;
    for (let k = k0; k < k1; k++) if (K[k + 1] - K[k] > hmax) hmax = K[k + 1] - K[k];
    const M = hmax > 0 ? derivativeBound(src, order, K[k0], K[k1]) : 0;
    runBound[r] = hmax === 0 ? -Infinity : Number.isFinite(M) ? remainder(M, hmax) : Infinity;
  }
  const byBound = Array.from({ length: runs }, (_, r) => r).sort((x, y) => runBound[y] - runBound[x] || x - y);
  let worst = 0;
  for (const r of byBound) {
    if (runBound[r] <= worst) break;
    for (let k = r * CHUNK; k < Math.min(intervals, (r + 1) * CHUNK); k++) {
      const a0 = K[k], a1 = K[k + 1];
      if (!(a1 > a0)) continue;
      const M = derivativeBound(src, order, a0, a1);
      if (!Number.isFinite(M)) return null;
      const e = remainder(M, a1 - a0);
      if (e !== e) return null; // NaN counts as +Infinity
      if (e > worst) worst = e;
    }
  }
  return Number.isFinite(worst) ? worst : null;
}
