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

const firstNonEmpty_ = firstNonEmpty;
const makeQuantizer_ = makeQuantizer;
const encodeOne_ = encodeOne;
const decodeOne_ = decodeOne;
const unormMax_ = unormMax;

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
 */
export function entrySlope(src: BakeSource, t: number, seg: number, br: Break | null, last: boolean, lastSegment: number): number {
  const S = src.times;
  if (last) return src.value(lastSegment, Math.min(t, S[S.length - 1]), 1);
  if (br) return 0.5 * (src.value(br.left, t, 1) + src.value(br.right, t, 1));
  return seg >= 0 ? src.value(seg, t, 1) : 0;
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

/** Grow-only scratch buffers (one trial at a time). */
let cap = 0;
let T = new Float64Array(0), XV = new Float64Array(0), XM = new Float64Array(0), DV = new Float64Array(0), DM = new Float64Array(0);
let SEG = new Int32Array(0), PIECE = new Int32Array(0), BRK = new Int32Array(0);
let HAVE = new Uint8Array(0);
let PK0 = new Int32Array(0), PK1 = new Int32Array(0);

function ensure(n: number, pieces: number): void {
  if (n > cap) {
    cap = Math.max(n, 2 * cap, 64);
    T = new Float64Array(cap); XV = new Float64Array(cap); XM = new Float64Array(cap); DV = new Float64Array(cap); DM = new Float64Array(cap);
    SEG = new Int32Array(cap); PIECE = new Int32Array(cap); BRK = new Int32Array(cap); HAVE = new Uint8Array(cap);
  }
  if (PK0.length < pieces) { PK0 = new Int32Array(pieces); PK1 = new Int32Array(pieces); }
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
   * Run one trial of n entries: `window(view)` first (view valid on the window's entries [wa, wb]); when it
   * returns a figure above `tol` that is the outcome, else the whole table is filled and `full(view)` runs.
   */
  run(
    n: number, wa: number, wb: number, hasWindow: boolean, tol: number,
    window: (v: TrialView) => number, full: (v: TrialView) => { e: number; at: number },
  ): TrialOutcome {
    const src = this.src, S = src.times, ns = S.length - 1;
    const P = this.pieces;
    ensure(n, P ? P.count : 0);
    const A = Math.fround(S[0]), B = Math.fround(S[ns]);
    const h = (B - A) / (n - 1);
    for (let k = 0; k < n; k++) T[k] = A + k * h;
    T[n - 1] = B;
    HAVE.fill(0, 0, n);
    // segment and piece of every entry (walks, no evaluation); breaks exactly at an entry (slopes)
    const S0 = S[0], SN = S[ns];
    {
      let i = 0, p = 0, b = 0;
      const br = this.breaks;
      if (P) for (let q = 0; q < P.count; q++) { PK0[q] = 0; PK1[q] = 0; }
      for (let k = 0; k < n; k++) {
        const t = T[k];
        let seg = -1;
        if (t >= S0 && t < SN) {
          while (i + 1 < ns && S[i + 1] <= t) i++;
          seg = i;
        }
        SEG[k] = seg;
        let piece = -1;
        if (P && seg >= 0) {
          // pieces of a segment are contiguous and tile [S_i, S_{i+1}): a_{p+1} is computed as b_p
          while (p < P.count && P.seg[p] < seg) p++;
          while (p + 1 < P.count && P.seg[p + 1] === seg && P.b[p] <= t) p++;
          piece = p;
          if (PK1[p] === 0) PK0[p] = k;
          PK1[p] = k + 1;
        }
        PIECE[k] = piece;
        if (this.hermite) {
          while (b < br.length && br[b].time < t) b++;
          BRK[k] = b < br.length && br[b].time === t && br[b].right >= 0 ? b : -1;
        }
      }
    }
    const vals = (k: number): void => {
      if (HAVE[k] & 1) return;
      HAVE[k] |= 1;
      XV[k] = entryValue(src, T[k], SEG[k]);
    };
    const slps = (k: number): void => {
      if (HAVE[k] & 2) return;
      HAVE[k] |= 2;
      const b = BRK[k];
      XM[k] = entrySlope(src, T[k], SEG[k], b >= 0 ? this.breaks[b] : null, k === n - 1, this.lastSegment);
    };
    let qv: Quantizer, qm: Quantizer | null = null;
    const e = this.profile.encoding;
    if (P) {
      // entries outside every piece (before S₀, from S_N on) and (slopes) breaks and the last entry first
      for (let k = 0; k < n; k++) {
        if (PIECE[k] < 0) { vals(k); if (this.hermite) slps(k); }
        else if (this.hermite && (BRK[k] >= 0 || k === n - 1)) slps(k);
      }
      const [vlo, vhi] = this.extremes(0, n, vals, XV, 1);
      qv = makeQuantizer_(e, vlo, vhi);
      if (this.hermite) {
        const [mlo, mhi] = this.extremes(1, n, slps, XM, 2);
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
      const w = window(view);
      if (w > tol) return { e: w, fullAt: null };
    }
    for (let k = 0; k < n; k++) { vals(k); if (this.hermite) slps(k); }
    roundTripRange(qv, XV, DV, 0, n);
    if (qm) roundTripRange(qm, XM, DM, 0, n);
    const m = full(view);
    return { e: m.e, fullAt: m.at };
  }

  /** Exact [min, max] over all n entries of values (o = 0) or slopes (o = 1), evaluating only where either can be. */
  private extremes(o: 0 | 1, n: number, get: (k: number) => void, X: Float64Array, bit: number): [number, number] {
    const P = this.pieces!;
    let lo = Infinity, hi = -Infinity;
    for (let k = 0; k < n; k++) if (HAVE[k] & bit) { const x = X[k]; if (x < lo) lo = x; if (x > hi) hi = x; }
    const byLo = P.byLo[o] as Int32Array & { bound: Float64Array };
    for (let r = 0; r < P.count; r++) {
      const q = byLo[r];
      if (byLo.bound[q] > lo) break;
      for (let k = PK0[q]; k < PK1[q]; k++) { get(k); const x = X[k]; if (x < lo) lo = x; if (x > hi) hi = x; }
    }
    const byHi = P.byHi[o] as Int32Array & { bound: Float64Array };
    for (let r = 0; r < P.count; r++) {
      const q = byHi[r];
      if (byHi.bound[q] < hi) break;
      for (let k = PK0[q]; k < PK1[q]; k++) { get(k); const x = X[k]; if (x < lo) lo = x; if (x > hi) hi = x; }
    }
    return [lo, hi];
  }
}
