/**
 * Uniform layout: N equally spaced entries on [start, end], O(1) lookup.
 *
 * 1. A continuous table cannot follow a jump J closer than J/2 (|p − f⁻| + |p − f⁺| ≥ J at the jump),
 *    so a jump with J/2 > tolerance makes every uniform table fail: reported with the curve and the time.
 * 2. Start size from the a-priori bound: h = √(8·tol/2/M2) (linear) or (384·tol/2/M4)^¼ (hermite),
 *    half the budget kept for round-off; N0 = ⌈D/h⌉ + 1 (mapped to the sample-count rule).
 * 3. Gallop/bisect on the candidate index for the smallest N whose measured error meets the tolerance,
 *    using the estimate measure (exact pieces exact; sampled pieces sampled without slack, a lower bound of
 *    the true error, so a count it rejects surely fails); then check the next 8 smaller candidates and
 *    step down while any passes (the error is not always monotone in N), so N − 1 … N − 8 all fail.
 * 4. Certify N with the full measure (exact or sampled+bound); if the proof misses, try larger counts
 *    (steps 1, 2, 4, …; at most 6 tries).
 * Entry values are the right-continuous source values; slopes the exact derivative (the mean of the two
 * one-sided slopes where an entry lands exactly on a slope break).
 */
import type { BakeSource } from './source';
import { sourceValue } from './source';
import type { Profile } from './profile';
import type { Break } from './breaks';
import { measureError, type ErrorMeasure } from './measure';
import { uniformTimes, type Table } from './table';
import { assembleTable } from './knots';
import { derivativeBound, widthForTolerance, boundOrder } from './bound';
import { candidates } from './candidates';

export const MAX_UNIFORM_ENTRIES = 4096;
const SCAN_BELOW = 8;

export interface UniformResult { table: Table; measure: ErrorMeasure; tried: Map<number, number> }

/** The uniform table of n entries (exact knot data, then encoded). */
export function uniformTable(src: BakeSource, profile: Profile, n: number, breaks: readonly Break[]): Table {
  const S = src.times;
  const A = Math.fround(S[0]), B = Math.fround(S[S.length - 1]);
  const times = uniformTimes(A, B, n);
  const values = new Float64Array(n);
  const slopes = profile.kernel === 'hermite' ? new Float64Array(n) : null;
  let b = 0;
  for (let k = 0; k < n; k++) {
    const t = times[k];
    values[k] = sourceValue(src, t, 0);
    if (slopes) {
      while (b < breaks.length && breaks[b].time < t) b++;
      const br = b < breaks.length && breaks[b].time === t && breaks[b].right >= 0 ? breaks[b] : null;
      slopes[k] = br ? 0.5 * (src.value(br.left, t, 1) + src.value(br.right, t, 1)) : sourceValue(src, t, 1);
      if (k === n - 1) slopes[k] = src.value(lastSeg(src), Math.min(t, S[S.length - 1]), 1);
    }
  }
  return assembleTable(profile, times, null, values, slopes);
}

function lastSeg(src: BakeSource): number {
  const T = src.times;
  for (let i = T.length - 2; i >= 0; i--) if (T[i + 1] > T[i]) return i;
  return 0;
}

/** Smallest uniform table within `tol`, or an error message naming the curve and the reason. */
export function bakeUniform(
  src: BakeSource, profile: Profile, tol: number, breaks: readonly Break[], frameRate: number,
): UniformResult | string {
  const S = src.times;
  const A = S[0], B = S[S.length - 1];
  for (const br of breaks) {
    if (br.order !== 0) continue;
    const J = Math.abs(br.valueRight - br.valueLeft);
    if (J / 2 > tol) {
      return `curve "${src.name}": the value jumps by ${J.toPrecision(4)} at t = ${br.time} s; no uniform table can stay within ${tol.toPrecision(3)} there (a continuous table is off by at least half the jump); use the adaptive layout`;
    }
  }
  const cand = candidates(profile.sampleCount, B - A, frameRate, MAX_UNIFORM_ENTRIES);
  if (typeof cand === 'string') return `curve "${src.name}": ${cand}`;
  if (cand.size === 0) return `curve "${src.name}": no entry count allowed by the sample-count rule`;
  // tried: entry count → certified error (Infinity when only the estimate was run and it failed)
  const tried = new Map<number, number>();
  const estimates = new Map<number, number>();
  const tables = new Map<number, { table: Table; measure: ErrorMeasure }>();
  const estOpts = { tolerance: tol, estimate: true };
  const opts = { tolerance: tol };
  const build = (n: number): Table | null => {
    try { return uniformTable(src, profile, n, breaks); } catch { return null; }
  };
  // ok(idx): the cheap estimate (a lower bound for sampled pieces, exact for exact ones) meets tol
  const ok = (idx: number): boolean => {
    const n = cand.at(idx);
    const seen = estimates.get(n);
    if (seen !== undefined) return seen <= tol;
    const table = build(n);
    const e = table ? measureError(src, table, estOpts).certified : Infinity;
    estimates.set(n, e);
    if (e > tol) tried.set(n, Infinity);
    return e <= tol;
  };
  const certify = (idx: number): boolean => {
    const n = cand.at(idx);
    const table = build(n);
    if (!table) { tried.set(n, Infinity); return false; }
    const measure = measureError(src, table, opts);
    tried.set(n, measure.certified);
    tables.set(n, { table, measure });
    return measure.certified <= tol;
  };
  // start size from the bound
  const M = derivativeBound(src, boundOrder(profile.kernel), A, B);
  const h = widthForTolerance(profile.kernel, M, tol / 2);
  const n0 = Number.isFinite(h) && h > 0 ? Math.ceil((B - A) / h) + 1 : 2;
  let i0 = 0;
  while (i0 + 1 < cand.size && cand.at(i0) < n0) i0++;
  let lo = -1, hi = -1;
  if (ok(i0)) {
    hi = i0;
    let d = 1;
    for (;;) {
      let j = hi - d;
      if (j < 0) {
        j = 0;
        if (hi > 0) { if (ok(0)) hi = 0; else lo = 0; }
        break;
      }
      if (ok(j)) { hi = j; d *= 2; } else { lo = j; break; }
    }
  } else {
    lo = i0;
    let d = 1;
    while (hi < 0) {
      const j = Math.min(lo + d, cand.size - 1);
      if (ok(j)) hi = j;
      else {
        if (j === cand.size - 1) {
          return `curve "${src.name}": no uniform table of at most ${cand.at(j)} entries stays within ${tol.toPrecision(3)} (smallest estimated error ${Math.min(...estimates.values()).toPrecision(3)})`;
        }
        lo = j; d *= 2;
      }
    }
  }
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (ok(mid)) hi = mid; else lo = mid;
  }
  // non-monotone guard: step down while one of the next smaller counts also passes the estimate
  for (let j = hi - 1; j >= 0 && j >= hi - SCAN_BELOW; j--) {
    if (ok(j)) hi = j;
  }
  // certify; where the estimate passed but the proof does not, move to the next count
  let step = 1, attempts = 0;
  while (!certify(hi)) {
    if (++attempts >= 6 || hi + 1 >= cand.size) {
      return `curve "${src.name}": no uniform table up to ${cand.at(hi)} entries is provably within ${tol.toPrecision(3)} (certified ${tried.get(cand.at(hi))!.toPrecision(3)})`;
    }
    hi = Math.min(hi + step, cand.size - 1);
    step *= 2;
  }
  const best = tables.get(cand.at(hi))!;
  return { table: best.table, measure: best.measure, tried };
}
