/**
 * The maximum error between the source curve and a decoded table, over the source's domain.
 *
 * The domain is cut at every source key and every table entry; on each piece both sides are one
 * formula. The error is the supremum of |f − p| over the closure of each piece (one-sided limits at the
 * ends), plus the end point itself. Pieces whose open interior holds no float32 number are skipped:
 * no float32 time can observe them (this is what lets a jump at a time that float32 cannot hold be
 * stored at the next float32 time).
 *
 * - exact: when the source segment is a cubic (step, linear, hermite), the difference of two cubics is
 *   a cubic whose max |·| is at a piece end or at a root of its derivative (./poly.ts maxAbsCubic).
 * - sampled+bound: otherwise the error g = f − p is sampled with n + 1 equally spaced points of step h';
 *   for |g''| ≤ M on the piece, max |g| ≤ max |g(sample)| + M·h'²/8 (linear-interpolation remainder,
 *   Burden & Faires §3.1, from memory). M = bound(f'') + max |p''|; h' is chosen so the slack is at
 *   most `slackFraction`·tolerance. Where the bound is not finite the piece is halved (up to 8 times).
 */
import type { BakeSource } from './source';
import { cubicAt, hermiteCoeffs, linearCoeffs, maxAbsCubic, MAX_SLOT, shiftCubic } from './poly';
import { evalTable, type Table } from './table';
import { nextUpF32 } from './encoding';

export type Method = 'exact' | 'sampled+bound';

export interface ErrorMeasure {
  /** Largest error found (exact where exact, else the largest sample). */
  maxError: number;
  /** Time of maxError. */
  at: number;
  /** Proven upper bound of the error (= maxError where every piece was exact). */
  certified: number;
  method: Method;
}

export interface MeasureOptions {
  /** Tolerance the slack is sized against. */
  tolerance: number;
  /** Slack of the sampled pieces as a fraction of the tolerance (default 0.05). */
  slackFraction?: number;
  /** Cap on samples per piece (default 4096). */
  maxSamples?: number;
  /** Also compare the end value when the range reaches the domain's end (default true). */
  includeEnd?: boolean;
}

type TableView = Pick<Table, 'kernel' | 'times' | 'values' | 'slopes'>;

const SRC = new Float64Array(4);
const TAB = new Float64Array(4);
const DIFF = new Float64Array(4);

/** Table coefficients of region k (−1 before, N−1 after) shifted to origin x0, into TAB. */
function tableCoeffs(tab: TableView, k: number, x0: number): Float64Array {
  const T = tab.times, V = tab.values, n = T.length;
  if (k < 0 || k >= n - 1) {
    TAB[0] = k < 0 ? V[0] : V[n - 1]; TAB[1] = 0; TAB[2] = 0; TAB[3] = 0;
    return TAB;
  }
  const H = T[k + 1] - T[k];
  if (tab.kernel === 'hermite' && tab.slopes) hermiteCoeffs(V[k], tab.slopes[k], V[k + 1], tab.slopes[k + 1], H, TAB);
  else linearCoeffs(V[k], V[k + 1], H, TAB);
  return shiftCubic(TAB, x0 - T[k]);
}

/** State shared by one measurement (kept in a module slot to avoid allocation). */
let bestErr = 0, bestAt = 0, certified = 0, sampledUsed = false;

function record(err: number, at: number, cert: number): void {
  if (err > bestErr) { bestErr = err; bestAt = at; }
  if (cert > certified) certified = cert;
}

/** Exact piece: source cubic of segment i minus table cubic (TAB already at origin x0). */
function exactPiece(src: BakeSource, i: number, x0: number, x1: number): void {
  const p = src.poly(i)!;
  SRC[0] = p[0]; SRC[1] = p[1]; SRC[2] = p[2]; SRC[3] = p[3];
  shiftCubic(SRC, x0 - src.times[i]);
  DIFF[0] = SRC[0] - TAB[0]; DIFF[1] = SRC[1] - TAB[1]; DIFF[2] = SRC[2] - TAB[2]; DIFF[3] = SRC[3] - TAB[3];
  const e = maxAbsCubic(DIFF, x1 - x0);
  record(e, x0 + MAX_SLOT[1], e);
}

/** Sampled piece with the second-derivative slack. TAB holds the table cubic at origin x0. */
function sampledPiece(src: BakeSource, i: number, x0: number, x1: number, slackAbs: number, maxSamples: number, depth: number): void {
  sampledUsed = true;
  const L = x1 - x0;
  const tabM2 = Math.max(Math.abs(2 * TAB[2]), Math.abs(2 * TAB[2] + 6 * TAB[3] * L));
  const M = src.bound(i, 2, x0, x1) + tabM2;
  if (!Number.isFinite(M)) {
    if (depth < 8) {
      const xm = x0 + L / 2;
      const c0 = TAB[0], c1 = TAB[1], c2 = TAB[2], c3 = TAB[3];
      sampledPiece(src, i, x0, xm, slackAbs, maxSamples, depth + 1);
      TAB[0] = c0; TAB[1] = c1; TAB[2] = c2; TAB[3] = c3;
      shiftCubic(TAB, L / 2);
      sampledPiece(src, i, xm, x1, slackAbs, maxSamples, depth + 1);
      return;
    }
  }
  let n = 1;
  if (M > 0 && Number.isFinite(M)) n = Math.min(maxSamples, Math.max(1, Math.ceil(L / Math.sqrt((8 * slackAbs) / M))));
  else if (!Number.isFinite(M)) n = maxSamples;
  const h = L / n;
  let localMax = 0, localAt = x0;
  for (let j = 0; j <= n; j++) {
    const u = j === n ? L : j * h;
    const t = x0 + u;
    const e = Math.abs(src.value(i, t, 0) - cubicAt(TAB, u));
    if (e > localMax) { localMax = e; localAt = t; }
  }
  const slack = Number.isFinite(M) ? (M * h * h) / 8 : Infinity;
  record(localMax, localAt, localMax + slack);
}

/**
 * Maximum error of `tab` against `src` on [from, to] (default: the source's whole domain).
 * Allocation-free apart from the returned object.
 */
export function measureError(src: BakeSource, tab: TableView, opts: MeasureOptions, from?: number, to?: number): ErrorMeasure {
  const S = src.times;
  const ns = S.length - 1;
  const A = from ?? S[0];
  const B = to ?? S[ns];
  const slackAbs = opts.tolerance * (opts.slackFraction ?? 0.05);
  const maxSamples = opts.maxSamples ?? 4096;
  const K = tab.times;
  const nk = K.length;
  bestErr = 0; bestAt = A; certified = 0; sampledUsed = false;
  // first table region at A
  let k = -1;
  while (k + 1 < nk && K[k + 1] <= A) k++;
  for (let i = 0; i < ns; i++) {
    const a = Math.max(S[i], A), b = Math.min(S[i + 1], B);
    if (!(b > a)) continue;
    const exact = src.poly(i) !== null;
    // walk table regions overlapping [a, b]
    while (k >= 0 && K[k] > a) k--;
    while (k + 1 < nk && K[k + 1] <= a) k++;
    let x0 = a;
    while (x0 < b) {
      const hi = k + 1 < nk ? K[k + 1] : Infinity;
      const x1 = Math.min(b, hi);
      if (x1 > x0 && nextUpF32(x0) < x1) {
        tableCoeffs(tab, k, x0);
        if (exact) exactPiece(src, i, x0, x1);
        else sampledPiece(src, i, x0, x1, slackAbs, maxSamples, 0);
      }
      if (x1 >= b) break;
      x0 = x1;
      k++;
      while (k + 1 < nk && K[k + 1] <= x0) k++;
    }
  }
  // the end point itself (a step into the last key shows only there)
  if (opts.includeEnd !== false && (to === undefined || to >= S[ns])) {
    const e = Math.abs(src.endValue - evalTable(tab, B));
    record(e, B, e);
  }
  return { maxError: bestErr, at: bestAt, certified, method: sampledUsed ? 'sampled+bound' : 'exact' };
}
