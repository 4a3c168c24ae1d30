/**
 * Uniform layout: N equally spaced entries on [start, end], O(1) lookup.
 *
 * 1. A continuous table cannot follow a jump J closer than J/2 (|p − f⁻| + |p − f⁺| ≥ J at the jump),
 *    so a jump with J/2 > tolerance makes every uniform table fail: reported with the curve and the time.
 * 2. Start size from the a-priori bound: h = √(8·tol/2/M2) (linear) or (384·tol/2/M4)^¼ (hermite),
 *    half the budget kept for round-off; N0 = ⌈D/h⌉ + 1 (mapped to the sample-count rule).
 * 3. Search the candidate index with the estimate measure (exact pieces exact; sampled pieces sampled
 *    without slack, a lower bound of the true error, so a count it rejects surely fails). The error is not
 *    always monotone in N (a kink's place against the grid), so the search bisects on "some count among
 *    j − 8 … j passes", which ends at an N that passes while N − 1 … N − 9 all fail.
 *    The estimate only decides (./measure.ts decideOnly): it stops at the first piece above tol and
 *    skips every piece whose bound is below it; a count is first tried on a few entries around each of
 *    the last 4 places where a rejected count failed (the search spends most counts there).
 * 4. Certify N with the full measure (exact or sampled+bound), on the table built for N with the origins
 *    of its entries (./entries.ts tableOrigins); if the proof misses, N counts as failed, the search
 *    gallops up from N on the same window question and bisects again (at most 32 rounds).
 * Entry values are the right-continuous source values; slopes the exact derivative (the mean of the two
 * one-sided slopes where an entry lands exactly on a slope break); where that derivative is not finite
 * (a vertical tangent) the secant over ⅛ grid step into the segment (./slopes.ts entrySlope). Inside a
 * bezier or shape segment the value and slope are read from the segment's cubic stand-in (./proxy.ts,
 * within ε ≤ 2.5 % of the tolerance of the source; the measure certifies the table against the source
 * itself), a few operations instead of a time solve or a transcendental function per entry; on a
 * sliver next to a vertical tangent, on a break and at the end they come from the source as above.
 */
import type { BakeSource } from './source';
import { minMax, makeQuantizer, type Quantizer } from './encoding';
import type { Profile } from './profile';
import type { Break } from './breaks';
import { measureCertified, measureError, proxyDistance, type ErrorMeasure, type MeasureOptions } from './measure';
import { proxyFor, hasSampledSegments, CUBIC, type Proxy } from './proxy';
import { uniformTimes, type Table } from './table';
import { assembleTable } from './knots';
import { derivativeBound, widthForTolerance, boundOrder } from './bound';
import { candidates } from './candidates';
import { fillEntries, roundTrip, WindowTrials, MAX_SPOTS, windowHalfWidth, tableOrigins, type TrialView } from './entries';

// Imported functions used in the hot loops, held in module constants (a CommonJS bundle turns each
// call through an imported binding into a getter call on the exporting module).
const measureError_ = measureError;
const measureCertified_ = measureCertified;
const uniformTimes_ = uniformTimes;
const assembleTable_ = assembleTable;
const minMax_ = minMax;
const makeQuantizer_ = makeQuantizer;
const fillEntries_ = fillEntries;
const roundTrip_ = roundTrip;

export const MAX_UNIFORM_ENTRIES = 4096;
const SCAN_BELOW = 8;
/** Search-and-certify rounds before giving up (each round fails one more count). */
const MAX_ROUNDS = 32;

export interface UniformResult { table: Table; measure: ErrorMeasure; tried: Map<number, number> }

/**
 * The cubic stand-ins the entries of a sampled source are read from at tolerance `tol` (./proxy.ts), or
 * null for a source of polynomial segments only.
 */
export function entryProxy(src: BakeSource, tol: number): Proxy | null {
  return hasSampledSegments(src) ? proxyFor(src, proxyDistance(tol)) : null;
}

/**
 * The uniform table of n entries (knot data, then encoded), as bakeUniform builds it for tolerance `tol`
 * (which decides the stand-ins a sampled source's entries are read from; without it they are the source's).
 */
export function uniformTable(src: BakeSource, profile: Profile, n: number, breaks: readonly Break[], tol?: number): Table {
  return uniformTableWithKnots(src, profile, n, breaks, tol === undefined ? null : entryProxy(src, tol)).table;
}

/** A built uniform table with its entries' source values, segments and origins (fillEntries' segs, fns). */
type BuiltTable = { table: Table; values: Float64Array; segs: Int32Array; fns: Int32Array };

/** uniformTable, with the entry values and the segment of each (−2 where not the source's own value) for MeasureOptions.knotValues. */
function uniformTableWithKnots(src: BakeSource, profile: Profile, n: number, breaks: readonly Break[], proxy: Proxy | null): BuiltTable {
  const S = src.times;
  const A = Math.fround(S[0]), B = Math.fround(S[S.length - 1]);
  const times = uniformTimes_(A, B, n);
  const values = new Float64Array(n);
  const slopes = profile.kernel === 'hermite' ? new Float64Array(n) : null;
  const segs = new Int32Array(n), fns = new Int32Array(n);
  fillEntries_(src, proxy, times, values, slopes, breaks, segs, fns);
  return { table: assembleTable_(profile, times, null, values, slopes), values, segs, fns };
}

/** Reused buffers of the trial tables the search measures and throws away (grown on demand). */
let bufT = new Float64Array(0), bufV = new Float64Array(0), bufM = new Float64Array(0);

/**
 * A trial table of n entries: the same decoded times, values and slopes as uniformTable(…, n, …) (same
 * quantizers from the same min/max), in reused buffers; valid until the next call. Throws as
 * uniformTable does (f16 overflow).
 */
function trialTable(src: BakeSource, profile: Profile, n: number, breaks: readonly Break[], proxy: Proxy | null): Pick<Table, 'kernel' | 'times' | 'values' | 'slopes'> {
  if (bufT.length < n) {
    const m = Math.max(n, 2 * bufT.length, 64);
    bufT = new Float64Array(m); bufV = new Float64Array(m); bufM = new Float64Array(m);
  }
  const S = src.times;
  const A = Math.fround(S[0]), B = Math.fround(S[S.length - 1]);
  const times = bufT.subarray(0, n);
  const h = (B - A) / (n - 1);
  for (let k = 0; k < n; k++) times[k] = A + k * h;
  times[n - 1] = B;
  const values = bufV.subarray(0, n);
  const slopes = profile.kernel === 'hermite' ? bufM.subarray(0, n) : null;
  fillEntries_(src, proxy, times, values, slopes, breaks);
  const e = profile.encoding;
  const [vlo, vhi] = minMax_(values);
  const qv = makeQuantizer_(e, vlo, vhi);
  let qm: Quantizer | null = null;
  if (slopes) { const [slo, shi] = minMax_(slopes); qm = makeQuantizer_(e, slo, shi); }
  roundTrip_(qv, values, 0, n);
  if (slopes) roundTrip_(qm!, slopes, 0, n);
  return { kernel: profile.kernel, times, values, slopes };
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
  const estOpts = { tolerance: tol, estimate: true, stopAbove: tol, decideOnly: true };
  const winOpts = { tolerance: tol, estimate: true, stopAbove: tol, includeEnd: false, decideOnly: true };
  // a window trial's options: its stopping figure (tol, or above it for the raw window test of unorm
  // trials) and the region holding its start, set per window (./entries.ts WindowTrials.run)
  const trialWin: MeasureOptions = { ...winOpts };
  // the last few places where a rejected count was off by more than tol (the error is local: a kink or a
  // fast turn), most recent first: a trial measures a window around each before the whole table (the
  // search's counts fail at a few places in turn)
  const spots: number[] = [];
  const failedAt = (x: number): void => {
    const near = (B - A) * 1e-3;
    for (let i = 0; i < spots.length; i++) if (Math.abs(spots[i] - x) <= near) { spots.splice(i, 1); break; }
    spots.unshift(x);
    if (spots.length > MAX_SPOTS) spots.length = MAX_SPOTS;
  };
  const opts = { tolerance: tol };
  // a sampled source's entries are read from its cubic stand-ins (./proxy.ts): a few operations each
  const proxy = entryProxy(src, tol);
  // trial tables that fill only the entries a window measure reads (./entries.ts)
  const trials = WindowTrials.applies(profile) ? new WindowTrials(src, profile, breaks, proxy) : null;
  // the measurements of a window trial (made once: ok runs for every count tried)
  const measureWindow = (v: TrialView, stop: number, wa: number, wb: number, region: number): number => {
    trialWin.stopAbove = stop;
    trialWin.startRegion = region;
    return measureCertified_(src, v, trialWin, wa, wb);
  };
  const measureWhole = (v: TrialView): { e: number; at: number } => { const m = measureError_(src, v, estOpts); return { e: m.certified, at: m.at }; };
  // ok(idx): the cheap estimate (a lower bound for sampled pieces, exact for exact ones) meets tol
  const ok = (idx: number): boolean => {
    const n = cand.at(idx);
    const seen = estimates.get(n);
    if (seen !== undefined) return seen <= tol;
    let e = Infinity;
    if (trials) {
      const r = trials.run(n, spots, tol, measureWindow, measureWhole);
      e = r.e;
      if (r.fullAt !== null && e > tol) failedAt(r.fullAt);
      else if (r.spot > 0) failedAt(spots[r.spot]);
      estimates.set(n, e);
      if (e > tol) tried.set(n, Infinity);
      return e <= tol;
    }
    let table: Pick<Table, 'kernel' | 'times' | 'values' | 'slopes'> | null;
    try { table = trialTable(src, profile, n, breaks, proxy); } catch { table = null; }
    if (table) {
      // look first around the last failures: a window of a few entries there rejects most counts at once
      // (every sample is a true error, so a window above tol is a proof that the whole table fails)
      const w = windowHalfWidth(src, n);
      for (let i = 0; i < spots.length && e === Infinity; i++) {
        const win = measureError_(src, table, winOpts, Math.max(A, spots[i] - w), Math.min(B, spots[i] + w));
        if (win.certified > tol) { e = win.certified; if (i > 0) failedAt(spots[i]); }
      }
      if (e === Infinity) {
        const m = measureError_(src, table, estOpts);
        e = m.certified;
        if (e > tol) failedAt(m.at);
      }
    }
    estimates.set(n, e);
    if (e > tol) tried.set(n, Infinity);
    return e <= tol;
  };
  const certify = (idx: number): boolean => {
    const n = cand.at(idx);
    let built: BuiltTable | null;
    try { built = uniformTableWithKnots(src, profile, n, breaks, proxy); } catch { built = null; }
    if (!built) { tried.set(n, Infinity); return false; }
    const table = built.table;
    const view = { ...table, origins: tableOrigins(table, built.fns, proxy) };
    const measure = measureError_(src, view, { ...opts, knotValues: built.values, knotSegments: built.segs });
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
  // The error is not monotone in N, so search on the window predicate P(j): "some count in
  // j − SCAN_BELOW … j passes" (P(j) = false for j < 0). Invariant: P(lo) is false and hi passes.
  // At hi = lo + 1, hi passes and hi − 1 … hi − 1 − SCAN_BELOW fail.
  const passIn = (j: number): number => {
    for (let m = j; m >= 0 && m >= j - SCAN_BELOW; m--) if (ok(m)) return m;
    return -1;
  };
  // refused: the largest count's whole table measured to its end (the estimate: every figure of it a
  // true error or a lower bound of one), so the message names its largest error and where, whatever
  // the search's trials looked at
  const none = () => {
    const N = cand.at(cand.size - 1);
    let what = 'unknown';
    try {
      const m = measureError_(src, trialTable(src, profile, N, breaks, proxy), { tolerance: tol, estimate: true });
      what = `${m.certified.toPrecision(3)}, near t = ${Number(m.at.toPrecision(4))} s`;
    } catch { /* a table that cannot be encoded (f16 overflow): no figure */ }
    return `curve "${src.name}": no uniform table of at most ${N} entries stays within ${tol.toPrecision(3)} (with ${N} entries the error is still at least ${what}); use the adaptive layout or a larger tolerance`;
  };
  let lo = -1, hi = -1;
  // a count that passes the estimate: i0, or the first found galloping upward from it; then bisect on P
  // from lo = −1 (fewer steps than galloping down when the bound's start is far above the answer)
  if (ok(i0)) hi = i0;
  else {
    let f = i0;
    for (let d = 1; hi < 0; d *= 2) {
      const j = Math.min(f + d, cand.size - 1);
      if (ok(j)) hi = j;
      else if (j === cand.size - 1) return none();
      else f = j;
    }
  }
  // rounds: bisect, certify; a count whose proof misses fails from then on, and P(that count) is false
  for (let round = 0; ; round++) {
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      const p = passIn(mid);
      if (p < 0) lo = mid; else hi = p;
    }
    if (certify(hi)) break;
    const n = cand.at(hi);
    estimates.set(n, tried.get(n)!);
    failedAt(tables.get(n)!.measure.at);
    if (round + 1 >= MAX_ROUNDS || hi + 1 >= cand.size) {
      return `curve "${src.name}": no uniform table up to ${n} entries is provably within ${tol.toPrecision(3)} (certified ${tried.get(n)!.toPrecision(3)})`;
    }
    // gallop up on P from lo = hi to the next window holding a passing count
    lo = hi; hi = -1;
    for (let d = 1; hi < 0; d *= 2) {
      const j = Math.min(lo + d, cand.size - 1);
      const p = passIn(j);
      if (p >= 0) hi = p;
      else if (j === cand.size - 1) return none();
      else lo = j;
    }
  }
  const best = tables.get(cand.at(hi))!;
  return { table: best.table, measure: best.measure, tried };
}
