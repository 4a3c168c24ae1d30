/**
 * Trial tables of the uniform search (./uniform.ts), evaluated lazily.
 *
 * Most trial counts are rejected by a window of a few entries around the last failure, so a trial
 * evaluates the source only where the answer can depend on it:
 * - the window's entries (their decoded values and slopes are all the window measure reads);
 * - for unorm encodings, the entries that can hold the minimum or the maximum of the values (and of the
 *   slopes), because the quantizer's offset and scale come from them. The domain is cut once per curve
 *   into reference pieces (PIECES per non-empty segment); on a piece [a, b] with |f'| ≤ M (the source's
 *   derivative bound) every f(t) lies in [(f(a) + f(b) − M(b − a))/2, (f(a) + f(b) + M(b − a))/2]
 *   (from f(t) ≥ f(a) − M(t − a) and f(t) ≥ f(b) − M(b − t); likewise above), widened by a margin far
 *   above double round-off. Pieces are visited by increasing lower bound: once a piece's lower bound is
 *   above the smallest value evaluated so far, no entry there or in any later piece can be the minimum
 *   (and so for the maximum). The minimum and maximum found are therefore exactly those of all entries,
 *   and so is the quantizer.
 * Only when the window does not reject the count are the remaining entries evaluated and the whole table
 * measured. Every number a measurement reads is the one uniformTable would hold for the same count (same
 * entry formula, same quantizer, same encode/decode arithmetic), so the search takes the same path and
 * returns the same table as with full trial tables. Float32 needs no quantizer (window only); f16 (which
 * refuses a table with any value out of its range) builds full trial tables.
 */
import type { BakeSource } from './source';
import { firstNonEmpty } from './source';
import type { Profile } from './profile';
import type { Break } from './breaks';
import { makeQuantizer, encodeOne, decodeOne, unormMax, type Quantizer } from './encoding';
import type { Table } from './table';
import { finiteSlope, mayReplace } from './slopes';

const firstNonEmpty_ = firstNonEmpty;
const makeQuantizer_ = makeQuantizer;
const encodeOne_ = encodeOne;
const decodeOne_ = decodeOne;
const unormMax_ = unormMax;
const finiteSlope_ = finiteSlope;

/** Reference pieces per non-empty segment (brackets of the values and slopes for the min/max search). */
const PIECES = 24;

export type TrialView = Pick<Table, 'kernel' | 'times' | 'values' | 'slopes'>;

/** Index of the last non-empty segment (the end entry's slope comes from it). */
export function lastSeg(src: BakeSource): number {
  const T = src.times;
  for (let i = T.length - 2; i >= 0; i--) if (T[i + 1] > T[i]) return i;
  return 0;
}

/** Entry value at t (seg: the segment holding t, −1 outside [S₀, S_N)): sourceValue(src, t, 0). */
export function entryValue(src: BakeSource, t: number, seg: number): number {
  const S = src.times;
  if (t < S[0]) return src.value(firstNonEmpty_(src), S[0], 0);
  if (t >= S[S.length - 1]) return src.endValue;
  return src.value(seg, t, 0);
}

/**
 * Entry slope at t: the mean of the one-sided slopes when `br` is a break exactly at t (with a right
 * segment), else the segment's slope (0 outside [S₀, S_N)); the last entry takes the last segment's slope.
 * Each slope is made finite by ./slopes.ts finiteSlope (secant over ⅛ grid step at a vertical tangent).
 */
export function entrySlope(src: BakeSource, t: number, seg: number, br: Break | null, last: boolean, lastSegment: number, step: number): number {
  const S = src.times;
  // secant over ⅛ of the grid step: for f ≈ c·√u (circ, a bezier handle with dx/ds = 0) the Hermite
  // interval [0, H] with m0 = c/√(H/8) ≈ 2.8·(secant over H) is within a few % of the best m0 (max error
  // ≈ 0.105·c·√H against 0.23·c·√H with the plain secant; measured by dense sampling, .tmp script)
  const w = 0.125 * step;
  if (last) {
    const te = Math.min(t, S[S.length - 1]);
    return finiteSlope_(src, lastSegment, te, -1, src.value(lastSegment, te, 1), w);
  }
  if (br) return 0.5 * (finiteSlope_(src, br.left, t, -1, src.value(br.left, t, 1), w) + finiteSlope_(src, br.right, t, 1, src.value(br.right, t, 1), w));
  return seg >= 0 ? finiteSlope_(src, seg, t, 1, src.value(seg, t, 1), w) : 0;
}

/** decodeOne(q, encodeOne(q, x)) for xs[from..to) into out (the same arithmetic as encodeArray). */
export function roundTripRange(q: Quantizer, xs: Float64Array, out: Float64Array, from: number, to: number): void {
  if (q.encoding === 'f32') { for (let j = from; j < to; j++) out[j] = Math.fround(xs[j]); return; }
  if (q.encoding === 'f16') { for (let j = from; j < to; j++) out[j] = decodeOne_(q, encodeOne_(q, xs[j])); return; }
  const M = unormMax_(q.encoding), off = q.offset, sc = q.scale;
  for (let j = from; j < to; j++) {
    let c = 0;
    if (sc !== 0) {
      c = Math.round(((xs[j] - off) / sc) * M);
      c = c < 0 ? 0 : c > M ? M : c;
    }
    out[j] = off + sc * (c / M);
  }
}

interface Pieces {
  count: number;
  seg: Int32Array;
  a: Float64Array;
  b: Float64Array;
  /** Piece order by increasing lower / decreasing upper bound, for values (0) and slopes (1). */
  byLo: Int32Array[];
  byHi: Int32Array[];
}

/** Lower and upper brackets of f^(order) on [a, b] of segment i (±Infinity when no finite bound). */
function bracket(src: BakeSource, i: number, a: number, b: number, order: 0 | 1, lo: Float64Array, hi: Float64Array, j: number): void {
  const fa = src.value(i, a, order), fb = src.value(i, b, order);
  const M = src.bound(i, order + 1, a, b);
  const L = b - a;
  const mid = 0.5 * (fa + fb), half = 0.5 * M * L;
  // margin: 1e-9 of the magnitudes involved, far above the evaluators' round-off (≤ 1e-12·|Δv| for bezier)
  const marg = 1e-9 * (Math.abs(fa) + Math.abs(fb) + half + 1e-300);
  const l = mid - half - marg, h = mid + half + marg;
  lo[j] = l === l && Number.isFinite(M) ? l : -Infinity;
  hi[j] = h === h && Number.isFinite(M) ? h : Infinity;
  // slopes: where an entry's slope may be replaced by a secant (./slopes.ts) the bracket of f' says
  // nothing about it, so the piece is always visited
  if (order === 1 && mayReplace(src, i, Math.max(Math.abs(lo[j]), Math.abs(hi[j])))) { lo[j] = -Infinity; hi[j] = Infinity; }
}

function makePieces(src: BakeSource, hermite: boolean): Pieces {
  const S = src.times;
  const ns = S.length - 1;
  let count = 0;
  for (let i = 0; i < ns; i++) if (S[i + 1] > S[i]) count += PIECES;
  const seg = new Int32Array(count), a = new Float64Array(count), b = new Float64Array(count);
  const orders = hermite ? 2 : 1;
  const byLo: Int32Array[] = [], byHi: Int32Array[] = [];
  const lo = [new Float64Array(count), new Float64Array(count)], hi = [new Float64Array(count), new Float64Array(count)];
  let j = 0;
  for (let i = 0; i < ns; i++) {
    const s0 = S[i], s1 = S[i + 1];
    if (!(s1 > s0)) continue;
    for (let p = 0; p < PIECES; p++) {
      seg[j] = i;
      a[j] = p === 0 ? s0 : s0 + ((s1 - s0) * p) / PIECES;
      b[j] = p === PIECES - 1 ? s1 : s0 + ((s1 - s0) * (p + 1)) / PIECES;
      for (let o = 0; o < orders; o++) bracket(src, i, a[j], b[j], o as 0 | 1, lo[o], hi[o], j);
      j++;
    }
  }
  for (let o = 0; o < orders; o++) {
    const L = lo[o], H = hi[o];
    byLo.push(Int32Array.from(Array.from({ length: count }, (_, q) => q).sort((x, y) => L[x] - L[y] || x - y)));
    byHi.push(Int32Array.from(Array.from({ length: count }, (_, q) => q).sort((x, y) => H[y] - H[x] || x - y)));
    // keep the bounds for the skip test
    (byLo[o] as Int32Array & { bound?: Float64Array }).bound = L;
    (byHi[o] as Int32Array & { bound?: Float64Array }).bound = H;
  }
  return { count, seg, a, b, byLo, byHi };
}

/** First index k < n with xs[k] ≥ x (n when none); xs sorted. */
function lowerBound(xs: Float64Array, n: number, x: number): number {
  let lo = 0, hi = n;
  while (lo < hi) { const mid = (lo + hi) >> 1; if (xs[mid] < x) lo = mid + 1; else hi = mid; }
  return lo;
}

/** Grow-only scratch buffers (one trial at a time). */
let cap = 0;
let T = new Float64Array(0), XV = new Float64Array(0), XM = new Float64Array(0), DV = new Float64Array(0), DM = new Float64Array(0);
let SPECIAL = new Int32Array(0), SG = new Int32Array(0);
let SPECIAL_N = 0;
let HAVE = new Uint8Array(0);

function ensure(n: number): void {
  if (n > cap) {
    cap = Math.max(n, 2 * cap, 64);
    T = new Float64Array(cap); XV = new Float64Array(cap); XM = new Float64Array(cap); DV = new Float64Array(cap); DM = new Float64Array(cap);
    SPECIAL = new Int32Array(cap); SG = new Int32Array(cap); HAVE = new Uint8Array(cap);
  }
}

export interface TrialOutcome {
  /** The estimate's certified figure (window's when it rejected, else the full measure's). */
  e: number;
  /** Set when the full measure ran: its `at`. */
  fullAt: number | null;
}

/** Lazy trial tables for one curve and profile. */
export class LazyTrials {
  private readonly pieces: Pieces | null;
  private readonly hermite: boolean;
  private readonly unorm: boolean;
  private readonly lastSegment: number;

  /** Whether lazy trials apply (f32 or unorm; f16 needs full trial tables). */
  static applies(profile: Profile): boolean {
    return profile.encoding !== 'f16';
  }

  constructor(private readonly src: BakeSource, private readonly profile: Profile, private readonly breaks: readonly Break[]) {
    this.hermite = profile.kernel === 'hermite';
    this.unorm = profile.encoding === 'unorm8' || profile.encoding === 'unorm16';
    this.pieces = this.unorm ? makePieces(src, this.hermite) : null;
    this.lastSegment = lastSeg(src);
  }

  /**
   * Run one trial of n entries: `window(view, …)` first (view valid on the window's entries [wa, wb]); when it
   * returns a figure above `tol` that is the outcome, else the whole table is filled and `full(view, …)` runs.
   * Both also get the exact entry values with their segments (−2 where not evaluated) for
   * MeasureOptions.knotValues.
   */
  run(
    n: number, wa: number, wb: number, hasWindow: boolean, tol: number,
    window: (v: TrialView, knotValues: Float64Array, knotSegments: Int32Array) => number,
    full: (v: TrialView, knotValues: Float64Array, knotSegments: Int32Array) => { e: number; at: number },
  ): TrialOutcome {
    const src = this.src, S = src.times, ns = S.length - 1;
    const P = this.pieces;
    ensure(n);
    const A = Math.fround(S[0]), B = Math.fround(S[ns]);
    const h = (B - A) / (n - 1);
    for (let k = 0; k < n; k++) T[k] = A + k * h;
    T[n - 1] = B;
    HAVE.fill(0, 0, n);
    SG.fill(-2, 0, n);
    const S0 = S[0], SN = S[ns];
    const br = this.breaks;
    // entries before S₀ are [0, kS0), from S_N on [kSN, n); piece q holds the entries in [a_q, b_q) (bisection)
    const kS0 = lowerBound(T, n, S0), kSN = lowerBound(T, n, SN);
    // the segment holding T[k]: the largest i < ns with S_i ≤ t (as sourceValue's binary search), −1 outside [S₀, S_N)
    const segOf = (k: number): number => {
      const t = T[k];
      if (!(t >= S0 && t < SN)) return -1;
      let lo = 0, hi = ns;
      while (hi - lo > 1) { const mid = (lo + hi) >> 1; if (S[mid] <= t) lo = mid; else hi = mid; }
      return lo;
    };
    // the first break with time ≥ T[k] if it is exactly at T[k] and has a right segment (the walk of uniformData)
    const brkOf = (k: number): Break | null => {
      const t = T[k];
      let lo = 0, hi = br.length;
      while (lo < hi) { const mid = (lo + hi) >> 1; if (br[mid].time < t) lo = mid + 1; else hi = mid; }
      return lo < br.length && br[lo].time === t && br[lo].right >= 0 ? br[lo] : null;
    };
    const vals = (k: number): void => {
      if (HAVE[k] & 1) return;
      HAVE[k] |= 1;
      const seg = segOf(k);
      XV[k] = entryValue(src, T[k], seg);
      if (seg >= 0) SG[k] = seg;
    };
    const slps = (k: number): void => {
      if (HAVE[k] & 2) return;
      HAVE[k] |= 2;
      XM[k] = entrySlope(src, T[k], segOf(k), brkOf(k), k === n - 1, this.lastSegment, h);
    };
    let qv: Quantizer, qm: Quantizer | null = null;
    const e = this.profile.encoding;
    if (P) {
      // entries outside every piece (before S₀, from S_N on) and, for slopes, the entries on a break and the
      // last entry (their slopes are not the segment's own): evaluated first, folded into the extremes
      SPECIAL_N = 0;
      for (let k = 0; k < kS0; k++) SPECIAL[SPECIAL_N++] = k;
      for (let k = kSN; k < n; k++) SPECIAL[SPECIAL_N++] = k;
      for (let j = 0; j < SPECIAL_N; j++) { vals(SPECIAL[j]); if (this.hermite) slps(SPECIAL[j]); }
      if (this.hermite) {
        slps(n - 1);
        for (let b = 0; b < br.length; b++) {
          const k = lowerBound(T, n, br[b].time);
          if (k < n && T[k] === br[b].time) slps(k);
        }
      }
      const [vlo, vhi] = this.extremes(0, vals, XV, 1, -1, n);
      qv = makeQuantizer_(e, vlo, vhi);
      if (this.hermite) {
        const [mlo, mhi] = this.extremes(1, slps, XM, 2, br.length, n);
        qm = makeQuantizer_(e, mlo, mhi);
      }
    } else {
      qv = makeQuantizer_(e, 0, 0);
      if (this.hermite) qm = makeQuantizer_(e, 0, 0);
    }
    const view: TrialView = { kernel: this.profile.kernel, times: T.subarray(0, n), values: DV.subarray(0, n), slopes: this.hermite ? DM.subarray(0, n) : null };
    if (hasWindow) {
      // entries the window measure reads: the region holding wa back one, to the first entry ≥ wb and one more
      let k0 = 0;
      while (k0 + 1 < n && T[k0 + 1] <= wa) k0++;
      let k1 = k0;
      while (k1 < n - 1 && T[k1] < wb) k1++;
      k0 = Math.max(0, k0 - 2); k1 = Math.min(n - 1, k1 + 2);
      for (let k = k0; k <= k1; k++) { vals(k); if (this.hermite) slps(k); }
      roundTripRange(qv, XV, DV, k0, k1 + 1);
      if (qm) roundTripRange(qm, XM, DM, k0, k1 + 1);
      const w = window(view, XV.subarray(0, n), SG.subarray(0, n));
      if (w > tol) return { e: w, fullAt: null };
    }
    for (let k = 0; k < n; k++) { vals(k); if (this.hermite) slps(k); }
    roundTripRange(qv, XV, DV, 0, n);
    if (qm) roundTripRange(qm, XM, DM, 0, n);
    const m = full(view, XV.subarray(0, n), SG.subarray(0, n));
    return { e: m.e, fullAt: m.at };
  }

  /**
   * Exact [min, max] over all n entries of values (o = 0) or slopes (o = 1), evaluating only where either
   * can be; the special entries (already evaluated: outside the pieces, and for slopes on breaks and the
   * last entry) are folded in first.
   */
  private extremes(o: 0 | 1, get: (k: number) => void, X: Float64Array, bit: number, breakCount: number, n: number): [number, number] {
    const P = this.pieces!;
    let lo = Infinity, hi = -Infinity;
    const fold = (k: number): void => { if (HAVE[k] & bit) { const x = X[k]; if (x < lo) lo = x; if (x > hi) hi = x; } };
    for (let j = 0; j < SPECIAL_N; j++) fold(SPECIAL[j]);
    if (o === 1) {
      fold(n - 1);
      const br = this.breaks;
      for (let b = 0; b < breakCount; b++) { const k = lowerBound(T, n, br[b].time); if (k < n && T[k] === br[b].time) fold(k); }
    }
    const byLo = P.byLo[o] as Int32Array & { bound: Float64Array };
    for (let r = 0; r < P.count; r++) {
      const q = byLo[r];
      if (byLo.bound[q] > lo) break;
      const k1 = lowerBound(T, n, P.b[q]);
      for (let k = lowerBound(T, n, P.a[q]); k < k1; k++) { get(k); const x = X[k]; if (x < lo) lo = x; if (x > hi) hi = x; }
    }
    const byHi = P.byHi[o] as Int32Array & { bound: Float64Array };
    for (let r = 0; r < P.count; r++) {
      const q = byHi[r];
      if (byHi.bound[q] < hi) break;
      const k1 = lowerBound(T, n, P.b[q]);
      for (let k = lowerBound(T, n, P.a[q]); k < k1; k++) { get(k); const x = X[k]; if (x < lo) lo = x; if (x > hi) hi = x; }
    }
    return [lo, hi];
  }
}
