/**
 * The entries of a uniform table: the value (and slope) each entry takes, and trial tables of the
 * uniform search that evaluate only the entries a measurement can read.
 *
 * An entry at t in segment i takes the value of the segment's cubic stand-in leaf holding t (./proxy.ts)
 * where there is one, else the source's own value (right-continuous; the start value before the domain,
 * the end value from its end on). Its slope is the leaf's derivative, else the source's (./slopes.ts
 * entrySlope: the mean of both sides on a break, the last segment's at the end, made finite).
 *
 * Window trials. Most trial counts of the search are rejected by a window of a few entries around the
 * last failure, so a trial first fills only the window's entries. For unorm encodings the quantizer's
 * offset and scale come from the minimum and maximum over all entries, which are found exactly without
 * filling the table: the domain is cut once per curve into pieces (each stand-in leaf; 8 pieces per
 * polynomial segment), each with the exact range of the value and slope functions its entries are
 * read from (the cubic's extremes: ends and critical points, widened by far more than rounding). Pieces
 * are visited by increasing lower (decreasing upper) bound; once a piece's lower bound is above the
 * smallest value found so far, no entry there or in any later piece can be the minimum (likewise for the
 * maximum). Entries whose numbers do not come from a piece's function (outside the domain, on a break, the
 * last entry, on a sliver without a cubic) are always evaluated. So the quantizer, and every number a
 * measurement reads, is the one the fully built table holds: the search is unchanged, only cheaper.
 */
import type { BakeSource } from './source';
import { firstNonEmpty } from './source';
import type { Break } from './breaks';
import type { Profile } from './profile';
import type { Table } from './table';
import { CUBIC, type Proxy } from './proxy';
import { entrySlope, keepsDerivative } from './slopes';
import { cubicAt, cubicSlopeAt } from './poly';
import { makeQuantizer, encodeOne, decodeOne, unormMax, minMax, unormCode, type Quantizer } from './encoding';
import type { EntryOrigins } from './measure';

const entrySlope_ = entrySlope;
const keepsDerivative_ = keepsDerivative;
const cubicAt_ = cubicAt;
const cubicSlopeAt_ = cubicSlopeAt;
const firstNonEmpty_ = firstNonEmpty;
const makeQuantizer_ = makeQuantizer;
const encodeOne_ = encodeOne;
const decodeOne_ = decodeOne;
const unormMax_ = unormMax;
const minMax_ = minMax;
const unormCode_ = unormCode;

export type TrialView = Pick<Table, 'kernel' | 'times' | 'values' | 'slopes'> & { origins?: EntryOrigins | null };

/** Index of the last non-empty segment (the end entry's slope comes from it). */
export function lastSegment(src: BakeSource): number {
  const T = src.times;
  for (let i = T.length - 2; i >= 0; i--) if (T[i + 1] > T[i]) return i;
  return 0;
}

/** Where entryAt writes: the value, the slope, and whether the value is the source's own (not a stand-in's). */
export const ENTRY = { value: 0, slope: 0, own: false };

/**
 * The value (and, with `slope`, the slope) of the entry at t: seg is the segment holding t (−1 outside
 * [S₀, S_N)), poly its src.poly(seg), leaf the stand-in leaf holding t (−1 when none), br the break exactly at t with a right
 * segment (or null), last whether it is the last entry, ls the last non-empty segment, w the grid step.
 */
export function entryAt(src: BakeSource, P: Proxy | null, t: number, seg: number, poly: Float64Array | null, leaf: number, br: Break | null, last: boolean, ls: number, w: number, slope: boolean): void {
  let m = 0, fromLeaf = false;
  if (seg < 0) ENTRY.value = t < src.times[0] ? src.value(firstNonEmpty_(src), src.times[0], 0) : src.endValue;
  else if (poly) {
    // the segment's own cubic (value(seg, t, ·) is this polynomial: ./source.ts), inline; its slope is finite
    const u = t - src.times[seg];
    ENTRY.value = cubicAt_(poly, u);
    ENTRY.own = true;
    if (slope) ENTRY.slope = !br && !last ? cubicSlopeAt_(poly, u) : entrySlope_(src, t, seg, br, last, ls, w);
    return;
  } else if (leaf >= 0 && P!.kind[leaf] === CUBIC) {
    const o = 4 * leaf, c = P!.c, u = t - P!.a[leaf];
    ENTRY.value = cubicAt_(c, u, o);
    m = cubicSlopeAt_(c, u, o);
    fromLeaf = true;
  } else ENTRY.value = src.value(seg, t, 0);
  ENTRY.own = seg >= 0 && !fromLeaf;
  if (slope) ENTRY.slope = fromLeaf && !br && !last ? m : entrySlope_(src, t, seg, br, last, ls, w);
}

/**
 * Every entry at `times` (increasing): values, slopes (null for linear) and, with segs, the segment of
 * each entry whose value is the source's own (−2 otherwise, for MeasureOptions.knotValues); with fns,
 * the cubic each entry's value and slope were read from (./measure.ts EntryOrigins). Segments, leaves
 * and breaks are found by walking forward with t.
 */
export function fillEntries(src: BakeSource, P: Proxy | null, times: Float64Array, values: Float64Array, slopes: Float64Array | null, breaks: readonly Break[], segs?: Int32Array, fns?: Int32Array): void {
  const n = times.length;
  fillRun(src, P, times, n, 0, n, (times[n - 1] - times[0]) / (n - 1), values, slopes, breaks, segs, fns);
}

/**
 * fillEntries for the entries [k0, k1) of a table of n entries (times[k0..k1) written; w the grid step),
 * into the same places of values, slopes, segs and fns: the same numbers as filling the whole table.
 */
export function fillRun(src: BakeSource, P: Proxy | null, times: Float64Array, n: number, k0: number, k1: number, w: number, values: Float64Array, slopes: Float64Array | null, breaks: readonly Break[], segs?: Int32Array, fns?: Int32Array): void {
  const S = src.times, ns = S.length - 1;
  const S0 = S[0], SN = S[ns];
  const ls = lastSegment(src);
  let i = 0, b = 0, leaf = 0;
  let polyOf = -1, poly: Float64Array | null = null;
  for (let k = k0; k < k1; k++) {
    const t = times[k];
    let seg = -1, lf = -1;
    if (t >= S0 && t < SN) {
      while (i + 1 < ns && S[i + 1] <= t) i++;
      seg = i;
      if (polyOf !== i) { polyOf = i; poly = src.poly(i); }
      if (P && P.first[i] < P.first[i + 1]) {
        if (leaf < P.first[i]) leaf = P.first[i];
        while (leaf + 1 < P.first[i + 1] && P.b[leaf] <= t) leaf++;
        lf = leaf;
      }
    }
    let br: Break | null = null;
    if (slopes) {
      while (b < breaks.length && breaks[b].time < t) b++;
      br = b < breaks.length && breaks[b].time === t && breaks[b].right >= 0 ? breaks[b] : null;
    }
    if (seg >= 0 && !br && k !== n - 1) {
      // the two common cases of entryAt without its call and ENTRY (the same numbers): the segment's own
      // cubic, a stand-in leaf; and so for every following entry before the segment's end, the leaf's end
      // (unless it is the segment's last) and the next break (hermite), none of them the last entry
      let lim = S[seg + 1];
      if (slopes) {
        let nb = b;
        while (nb < breaks.length && breaks[nb].time <= t) nb++;
        if (nb < breaks.length && breaks[nb].time < lim) lim = breaks[nb].time;
      }
      // the cubic (coefficients from c[o], about org) and what segs and fns record for its entries
      let c: Float64Array | null = null, o = 0, org = 0, sv = -2, fv = -1;
      if (poly) { c = poly; org = S[seg]; sv = seg; fv = -2 - seg; }
      else if (lf >= 0 && P!.kind[lf] === CUBIC) {
        c = P!.c; o = 4 * lf; org = P!.a[lf]; fv = lf;
        if (lf + 1 < P!.first[seg + 1] && P!.b[lf] < lim) lim = P!.b[lf];
      }
      if (c) {
        let j = k;
        do {
          const u = times[j] - org;
          values[j] = cubicAt_(c, u, o);
          if (slopes) slopes[j] = cubicSlopeAt_(c, u, o);
          if (segs) segs[j] = sv;
          if (fns) fns[j] = fv;
          j++;
        } while (j < k1 && j < n - 1 && times[j] < lim);
        k = j - 1;
        continue;
      }
    }
    if (fns) fns[k] = -1;
    entryAt(src, P, t, seg, seg >= 0 ? poly : null, lf, br, k === n - 1, ls, w, slopes !== null);
    values[k] = ENTRY.value;
    if (slopes) slopes[k] = ENTRY.slope;
    if (segs) segs[k] = ENTRY.own ? seg : -2;
  }
}

/** decodeOne(q, encodeOne(q, x)) for xs[from..to), in place (the same arithmetic as encodeArray). */
export function roundTrip(q: Quantizer, xs: Float64Array, from: number, to: number): void {
  if (q.encoding === 'f32') { for (let j = from; j < to; j++) xs[j] = Math.fround(xs[j]); return; }
  if (q.encoding === 'f16') { for (let j = from; j < to; j++) xs[j] = decodeOne_(q, encodeOne_(q, xs[j])); return; }
  const M = unormMax_(q.encoding), off = q.offset, sc = q.scale;
  for (let j = from; j < to; j++) xs[j] = off + sc * (unormCode_(xs[j], off, sc, M) / M);
}

/** [min, max] of c0 + c1·u + c2·u² + c3·u³ over u ∈ [0, L] (ends and the roots of the derivative), widened, into R[at], R[at + 1]. */
function cubicRange(c0: number, c1: number, c2: number, c3: number, L: number, R: Float64Array, at: number): void {
  const fL = c0 + L * (c1 + L * (c2 + L * c3));
  let lo = c0 < fL ? c0 : fL, hi = c0 < fL ? fL : c0;
  const a = 3 * c3, b = 2 * c2, c = c1;
  let r1 = -1, r2 = -1;
  if (a !== 0) {
    const d = b * b - 4 * a * c;
    if (d >= 0) {
      const q = -0.5 * (b + (b >= 0 ? Math.sqrt(d) : -Math.sqrt(d)));
      if (q !== 0) { r1 = q / a; r2 = c / q; }
    }
  } else if (b !== 0) r1 = -c / b;
  if (r1 > 0 && r1 < L) { const v = c0 + r1 * (c1 + r1 * (c2 + r1 * c3)); if (v < lo) lo = v; if (v > hi) hi = v; }
  if (r2 > 0 && r2 < L) { const v = c0 + r2 * (c1 + r2 * (c2 + r2 * c3)); if (v < lo) lo = v; if (v > hi) hi = v; }
  // margin: far above the rounding of Horner's rule on these terms (a few ulps of their sum)
  const marg = 1e-12 * (Math.abs(c0) + Math.abs(c1) * L + Math.abs(c2) * L * L + Math.abs(c3) * L * L * L) + 1e-300;
  R[at] = lo === lo ? lo - marg : -Infinity;
  R[at + 1] = hi === hi ? hi + marg : Infinity;
}

/** Polynomial segments are cut into this many pieces for the brackets. */
const POLY_PIECES = 8;

interface Pieces {
  count: number;
  /** The segment and the stand-in leaf (−1: none) each piece's entries lie in. */
  seg: Int32Array;
  leaf: Int32Array;
  a: Float64Array;
  b: Float64Array;
  /** [lo, hi] per piece: values at 2q, 2q + 1; slopes in the same layout. */
  values: Float64Array;
  slopes: Float64Array;
  /**
   * 1 where every entry of the piece reads the same number from a constant function (a hold's values, a
   * linear segment's slopes): the function's higher coefficients are exactly 0, so Horner's rule gives
   * c + u·0 = c for every u ≥ 0. One entry then stands for all of the piece's entries in the extremes.
   */
  vFlat: Uint8Array;
  mFlat: Uint8Array;
  /** [lo, hi] over every piece with finite ranges: values at 0, 1; slopes at 2, 3. */
  all: Float64Array;
  /** The pieces left out of `all`: a value or slope range not finite (a sliver or sampled leaf, no cubic). */
  open: Int32Array;
  /** Piece order by increasing lower bound / decreasing upper bound, for values and slopes. */
  vLo: Int32Array; vHi: Int32Array; mLo: Int32Array; mHi: Int32Array;
}

function makePieces(src: BakeSource, P: Proxy | null): Pieces {
  const S = src.times, ns = S.length - 1;
  // the pieces counted first, then written straight into typed arrays
  let count = 0;
  for (let i = 0; i < ns; i++) {
    if (!(S[i + 1] > S[i])) continue;
    count += src.poly(i) ? POLY_PIECES : P ? P.first[i + 1] - P.first[i] : 1;
  }
  const a = new Float64Array(count), b = new Float64Array(count), V = new Float64Array(2 * count), M = new Float64Array(2 * count);
  const sg = new Int32Array(count), lf = new Int32Array(count), vf = new Uint8Array(count), mf = new Uint8Array(count);
  const R = new Float64Array(2);
  let q = 0;
  for (let i = 0; i < ns; i++) {
    const s0 = S[i], s1 = S[i + 1];
    if (!(s1 > s0)) continue;
    const poly = src.poly(i);
    if (poly) {
      for (let j = 0; j < POLY_PIECES; j++) {
        const x0 = j === 0 ? s0 : s0 + ((s1 - s0) * j) / POLY_PIECES, x1 = j === POLY_PIECES - 1 ? s1 : s0 + ((s1 - s0) * (j + 1)) / POLY_PIECES;
        a[q] = x0; b[q] = x1; sg[q] = i; lf[q] = -1;
        vf[q] = poly[1] === 0 && poly[2] === 0 && poly[3] === 0 ? 1 : 0;
        mf[q] = poly[2] === 0 && poly[3] === 0 ? 1 : 0;
        // the polynomial about its own origin, shifted to x0 (exact shift in doubles is not needed: widened)
        const u0 = x0 - s0, L = x1 - x0;
        const c0 = poly[0] + u0 * (poly[1] + u0 * (poly[2] + u0 * poly[3]));
        const c1 = poly[1] + u0 * (2 * poly[2] + 3 * u0 * poly[3]);
        const c2 = poly[2] + 3 * u0 * poly[3];
        const c3 = poly[3];
        cubicRange(c0, c1, c2, c3, L, R, 0);
        // widen by the shift's rounding too (u0 up to the segment length)
        const wid = 1e-12 * (Math.abs(poly[0]) + (Math.abs(poly[1]) + (Math.abs(poly[2]) + Math.abs(poly[3]) * (s1 - s0)) * (s1 - s0)) * (s1 - s0));
        V[2 * q] = R[0] - wid; V[2 * q + 1] = R[1] + wid;
        cubicRange(c1, 2 * c2, 3 * c3, 0, L, R, 0);
        const widM = 1e-12 * (Math.abs(poly[1]) + (2 * Math.abs(poly[2]) + 3 * Math.abs(poly[3]) * (s1 - s0)) * (s1 - s0));
        M[2 * q] = R[0] - widM; M[2 * q + 1] = R[1] + widM;
        q++;
      }
    } else if (P) {
      for (let k = P.first[i]; k < P.first[i + 1]; k++) {
        a[q] = P.a[k]; b[q] = P.b[k]; sg[q] = i; lf[q] = k;
        if (P.kind[k] !== CUBIC) { V[2 * q] = M[2 * q] = -Infinity; V[2 * q + 1] = M[2 * q + 1] = Infinity; q++; continue; }
        const o = 4 * k, c = P.c, L = P.b[k] - P.a[k];
        vf[q] = c[o + 1] === 0 && c[o + 2] === 0 && c[o + 3] === 0 ? 1 : 0;
        mf[q] = c[o + 2] === 0 && c[o + 3] === 0 ? 1 : 0;
        cubicRange(c[o], c[o + 1], c[o + 2], c[o + 3], L, R, 0);
        V[2 * q] = R[0]; V[2 * q + 1] = R[1];
        cubicRange(c[o + 1], 2 * c[o + 2], 3 * c[o + 3], 0, L, R, 0);
        M[2 * q] = R[0]; M[2 * q + 1] = R[1];
        q++;
      }
    } else {
      a[q] = s0; b[q] = s1; sg[q] = i; lf[q] = -1; V[2 * q] = M[2 * q] = -Infinity; V[2 * q + 1] = M[2 * q + 1] = Infinity;
      q++;
    }
  }
  const all = new Float64Array([Infinity, -Infinity, Infinity, -Infinity]);
  const open: number[] = [];
  for (q = 0; q < count; q++) {
    if (!(Number.isFinite(V[2 * q]) && Number.isFinite(V[2 * q + 1]) && Number.isFinite(M[2 * q]) && Number.isFinite(M[2 * q + 1]))) { open.push(q); continue; }
    if (!(V[2 * q] >= all[0])) all[0] = V[2 * q];
    if (!(V[2 * q + 1] <= all[1])) all[1] = V[2 * q + 1];
    if (!(M[2 * q] >= all[2])) all[2] = M[2 * q];
    if (!(M[2 * q + 1] <= all[3])) all[3] = M[2 * q + 1];
  }
  return {
    count, seg: sg, leaf: lf, a, b, values: V, slopes: M,
    vFlat: vf, mFlat: mf, all, open: Int32Array.from(open),
    vLo: pieceOrder(V, 0, count, false), vHi: pieceOrder(V, 1, count, true),
    mLo: pieceOrder(M, 0, count, false), mHi: pieceOrder(M, 1, count, true),
  };
}

/**
 * The pieces 0 … count − 1 ordered by R[2q + o], increasing (or decreasing with `down`), equal keys by
 * index (the ranges hold no NaN). A stable sort without comparator calls: blocks of 16 by insertion,
 * then merged in widths doubling (the keys negated for `down`, which keeps every tie a tie).
 */
export function pieceOrder(R: Float64Array, o: 0 | 1, count: number, down: boolean): Int32Array {
  const key = new Float64Array(count);
  for (let q = 0; q < count; q++) key[q] = down ? -R[2 * q + o] : R[2 * q + o];
  let r = new Int32Array(count);
  for (let q = 0; q < count; q++) r[q] = q;
  const BLOCK = 16;
  for (let s = 0; s < count; s += BLOCK) {
    const e = Math.min(count, s + BLOCK);
    for (let q = s + 1; q < e; q++) {
      const x = r[q], kx = key[x];
      let j = q - 1;
      // x goes after every earlier piece whose key is not above its own (equal keys stay by index)
      while (j >= s && key[r[j]] > kx) { r[j + 1] = r[j]; j--; }
      r[j + 1] = x;
    }
  }
  if (count <= BLOCK) return r;
  let t = new Int32Array(count);
  for (let w = BLOCK; w < count; w *= 2) {
    for (let s = 0; s < count; s += 2 * w) {
      const m = Math.min(count, s + w), e = Math.min(count, s + 2 * w);
      let i = s, j = m, d = s;
      while (i < m && j < e) t[d++] = key[r[j]] < key[r[i]] ? r[j++] : r[i++];
      while (i < m) t[d++] = r[i++];
      while (j < e) t[d++] = r[j++];
    }
    const u = r; r = t; t = u;
  }
  return r;
}

/** Grow-only scratch buffers (one trial at a time). */
let cap = 0;
let T = new Float64Array(0), XV = new Float64Array(0), XM = new Float64Array(0), DV = new Float64Array(0), DM = new Float64Array(0);
/** The cubic each filled entry was read from (./measure.ts EntryOrigins fn). */
let FN = new Int32Array(0);
/** STAMP[k] === stamp: entry k (its time in T, its numbers in XV, XM) is filled in the current trial (no clearing per trial). */
let STAMP = new Uint32Array(0);
let stamp = 0;
function ensure(n: number): void {
  if (n > cap) {
    cap = Math.max(n, 2 * cap, 64);
    T = new Float64Array(cap); XV = new Float64Array(cap); XM = new Float64Array(cap); DV = new Float64Array(cap); DM = new Float64Array(cap);
    FN = new Int32Array(cap);
    STAMP = new Uint32Array(cap);
    stamp = 0;
    viewsH = []; viewsL = [];
  }
}
/** A trial's table view with the origins of its entries (its proxy and shifts set per trial and window). */
type OriginView = TrialView & { origins: EntryOrigins };
/** Views of the first n entries of T, DV (and DM for hermite), FN, by n: reused by every trial of that count until the buffers grow. */
let viewsH: (OriginView | undefined)[] = [], viewsL: (OriginView | undefined)[] = [];
function viewOf(n: number, hermite: boolean): OriginView {
  const views = hermite ? viewsH : viewsL;
  return views[n] ??= {
    kernel: hermite ? 'hermite' : 'linear', times: T.subarray(0, n), values: DV.subarray(0, n), slopes: hermite ? DM.subarray(0, n) : null,
    origins: { fn: FN.subarray(0, n), proxy: null, shiftV: 0, shiftM: 0, rel: 0 },
  };
}
/** A new trial: every entry unfilled. */
function nextStamp(): void {
  if (++stamp === 0xffffffff) { STAMP.fill(0); stamp = 1; }
}

/** The running [min, max] of WindowTrials.extremes. */
const EXT = new Float64Array(2);

/** Copies DV, DM of the entries XV, XM in [k0, k1): decoded with qv, qm, or as they are (raw). */
function decode(qv: Quantizer | null, qm: Quantizer | null, k0: number, k1: number, slopes: boolean): void {
  for (let k = k0; k < k1; k++) DV[k] = XV[k];
  if (qv) roundTrip(qv, DV, k0, k1);
  if (slopes) {
    for (let k = k0; k < k1; k++) DM[k] = XM[k];
    if (qm) roundTrip(qm, DM, k0, k1);
  }
}

/**
 * The most a unorm quantizer made for numbers in [lo, hi] moves one of them (M = 2ⁿ − 1): half a code
 * step of its scale, which is at most (hi − lo)(1 + 2⁻²³) once rounded to float32, plus the float32
 * rounding of its offset (at most 2⁻²⁴·|lo|: a number below the offset decodes to the offset), widened.
 */
export function unormShift(lo: number, hi: number, M: number): number {
  return ((hi - lo) * (0.5 + 2 ** -22)) / M + 2 ** -23 * (Math.abs(lo) + Math.abs(hi));
}

/** Set the shifts of a view's origins (./measure.ts EntryOrigins) for decoding with qv, qm (null: raw, the numbers as read). */
function setShifts(o: EntryOrigins, qv: Quantizer | null, qm: Quantizer | null): void {
  o.shiftV = 0; o.shiftM = 0; o.rel = 0;
  if (!qv) return;
  if (qv.encoding === 'f32') { o.rel = 2 ** -23; return; }
  const M = unormMax_(qv.encoding);
  if (M === 0) { o.rel = Infinity; return; } // f16 is not decoded here; no bound given
  o.shiftV = unormShift(qv.offset, qv.offset + qv.scale, M);
  if (qm) o.shiftM = unormShift(qm.offset, qm.offset + qm.scale, M);
}

/** The origins of a built table's entries (fn: fillEntries' fns), decoded with its own quantizers. */
export function tableOrigins(table: Table, fn: Int32Array, proxy: Proxy | null): EntryOrigins {
  const o: EntryOrigins = { fn, proxy, shiftV: 0, shiftM: 0, rel: 0 };
  const e = table.encoding;
  setShifts(o, { encoding: e, offset: table.valueOffset, scale: table.valueScale }, table.slopes ? { encoding: e, offset: table.slopeOffset, scale: table.slopeScale } : null);
  return o;
}

export interface TrialOutcome {
  /** The estimate's figure (the window's when it rejected, else the whole table's). */
  e: number;
  /** Set when the whole table was measured: where its largest error is. */
  fullAt: number | null;
  /** The index of the spot whose window rejected the count (−1: none did). */
  spot: number;
}

/** Most windows (failure spots) a trial measures first. */
export const MAX_SPOTS = 4;
const WA = new Float64Array(MAX_SPOTS), WB = new Float64Array(MAX_SPOTS);
const K0 = new Int32Array(MAX_SPOTS), K1 = new Int32Array(MAX_SPOTS), R = new Int32Array(MAX_SPOTS);

/** Half the width of a trial window of n entries: 4 grid steps of the source's domain. */
export function windowHalfWidth(src: BakeSource, n: number): number {
  const S = src.times;
  return (4 * (S[S.length - 1] - S[0])) / Math.max(1, n - 1);
}

/** At most this many entries a trial fills the whole table (cheaper than finding the extremes piece by piece), then measures its windows first. */
export const WINDOW_MIN_ENTRIES = 64;

/** Trial tables of one curve and profile (f32 and unorm encodings; f16 refuses out-of-range values, so it builds whole tables). */
export class WindowTrials {
  /** Built on the first window trial that needs the extremes (null: not yet, or not unorm). */
  private pieces: Pieces | null = null;
  private readonly unorm: boolean;
  private readonly hermite: boolean;
  private readonly ls: number;
  private n = 0;
  /** The current trial's grid: first and last time (float32 of the source's ends) and step. */
  private A = 0;
  private B = 0;
  private h = 0;

  static applies(profile: Profile): boolean {
    return profile.encoding !== 'f16';
  }

  constructor(private readonly src: BakeSource, private readonly profile: Profile, private readonly breaks: readonly Break[], private readonly P: Proxy | null) {
    this.hermite = profile.kernel === 'hermite';
    this.unorm = profile.encoding === 'unorm8' || profile.encoding === 'unorm16';
    this.ls = lastSegment(src);
  }

  /** Time of entry k of the current trial: the numbers run() writes into T for a whole table. */
  private tAt(k: number): number {
    return k === this.n - 1 ? this.B : this.A + k * this.h;
  }

  /** First index k < n with tAt(k) ≥ x (n when none): lowerBound over the grid without the array (tAt is non-decreasing). */
  private lb(x: number): number {
    const n = this.n;
    let k = Math.ceil((x - this.A) / this.h);
    if (!(k >= 0)) k = 0;
    if (k > n) k = n;
    while (k > 0 && this.tAt(k - 1) >= x) k--;
    while (k < n && this.tAt(k) < x) k++;
    return k;
  }

  /** The table region holding x: the largest k with tAt(k) ≤ x (−1 when none; the times increase). */
  private regionAt(x: number): number {
    const k = this.lb(x);
    return k < this.n && this.tAt(k) === x ? k : k - 1;
  }

  /** Fill entry k (value and slope) if not yet filled, with the same numbers fillEntries gives. */
  private fill(k: number): void {
    if (STAMP[k] === stamp) return;
    const src = this.src, S = src.times, ns = S.length - 1, P = this.P;
    const t = this.tAt(k);
    let seg = -1, lf = -1;
    if (t >= S[0] && t < S[ns]) {
      // the largest i < ns with S_i ≤ t (the segment fillEntries' walk reaches)
      let lo = 0, hi = ns;
      while (hi - lo > 1) { const mid = (lo + hi) >> 1; if (S[mid] <= t) lo = mid; else hi = mid; }
      seg = lo;
      if (P && P.first[seg] < P.first[seg + 1]) {
        // the first leaf of the segment with b > t (else its last leaf)
        let a = P.first[seg], z = P.first[seg + 1] - 1;
        while (a < z) { const mid = (a + z) >> 1; if (P.b[mid] <= t) a = mid + 1; else z = mid; }
        lf = a;
      }
    }
    this.fillWith(k, seg, lf);
  }

  /** Fill entry k known to lie in segment seg (−1 outside the domain) and stand-in leaf lf (−1: none). */
  private fillWith(k: number, seg: number, lf: number): void {
    STAMP[k] = stamp;
    const src = this.src, P = this.P;
    const t = this.tAt(k);
    T[k] = t;
    let br: Break | null = null;
    if (this.hermite) {
      const B = this.breaks;
      let lo = 0, hi = B.length;
      while (lo < hi) { const mid = (lo + hi) >> 1; if (B[mid].time < t) lo = mid + 1; else hi = mid; }
      br = lo < B.length && B[lo].time === t && B[lo].right >= 0 ? B[lo] : null;
    }
    const last = k === this.n - 1;
    // the cubic the entry's value and slope come from (fillEntries' fns)
    FN[k] = seg < 0 || br || last ? -1 : src.poly(seg) ? -2 - seg : lf >= 0 && P!.kind[lf] === CUBIC ? lf : -1;
    if (last && this.hermite) {
      // the last entry's slope is the same number in every trial unless it is a secant (./slopes.ts entrySlope)
      entryAt(src, P, t, seg, seg >= 0 ? src.poly(seg) : null, lf, br, true, this.ls, this.h, false);
      XV[k] = ENTRY.value;
      XM[k] = this.lastSlope(t);
      return;
    }
    entryAt(src, P, t, seg, seg >= 0 ? src.poly(seg) : null, lf, br, last, this.ls, this.h, this.hermite);
    XV[k] = ENTRY.value;
    if (this.hermite) XM[k] = ENTRY.slope;
  }

  /** The slope of the last entry at t (always the grid's end B): entrySlope's number, kept when it is the derivative itself. */
  private lastKept = Number.NaN;
  private lastSlope(t: number): number {
    if (this.lastKept === this.lastKept) return this.lastKept;
    const src = this.src, S = src.times, ls = this.ls;
    const te = Math.min(t, S[S.length - 1]);
    const m = src.value(ls, te, 1);
    // entrySlope returns the derivative itself then, whatever the grid step
    if (keepsDerivative_(src, ls, m)) { this.lastKept = m; return m; }
    return entrySlope_(src, t, -1, null, true, ls, this.h);
  }

  /**
   * One trial of n entries: a window of ±4 grid steps around each of `spots` (most recent failure first)
   * is measured first, `window(view, stopAbove, wa, wb)` (the view is valid on the entries the window
   * [wa, wb] reads; the measure may stop once its figure is above stopAbove); a figure above tol from one
   * of them is the outcome, else every entry is filled and `full(view)` measures the whole table.
   *
   * For unorm encodings each window is first measured on the entries before quantization, which needs no
   * extremes: quantizing moves a value by at most scale/(2M) and a slope by at most scaleₘ/(2M) (M = 2ⁿ − 1,
   * scale at most the width of every piece's range and the always-evaluated entries), so the table moves
   * by at most δ = δᵥ (linear: a convex combination) or δᵥ + h·δₘ/4 (hermite: the value weights are ≥ 0
   * and sum to 1, the slope weights h·s(1 − s)² and h·s²(1 − s) sum to at most h/4 in size). The
   * window's estimate (exact, or max |q − p| − ε per leaf) then moves by at most δ as well, so a raw
   * figure above tol + δ proves the quantized figure above tol: the same counts are rejected as by the
   * quantized window, with the figure less δ as the outcome (still a lower bound of the error).
   */
  run(n: number, spots: readonly number[], tol: number, window: (v: TrialView, stopAbove: number, wa: number, wb: number, region: number) => number, full: (v: TrialView) => { e: number; at: number }): TrialOutcome {
    const src = this.src, S = src.times, ns = S.length - 1;
    ensure(n);
    this.n = n;
    const A = Math.fround(S[0]), B = Math.fround(S[ns]);
    const h = (B - A) / (n - 1);
    // the times T[k] = A + k·h (T[n − 1] = B) are written where an entry is filled, until the whole table is
    this.A = A; this.B = B;
    // fillEntries' grid step, (T[n − 1] − T[0])/(n − 1) from the stored times: the same number as h
    this.h = h;
    nextStamp();
    const e = this.profile.encoding;
    let qv: Quantizer | null = null, qm: Quantizer | null = null;
    if (!this.unorm) {
      qv = makeQuantizer_(e, 0, 0);
      if (this.hermite) qm = makeQuantizer_(e, 0, 0);
    }
    // the windows: [wa, wb] = spot ± 4 grid steps of the source's domain, clipped to it
    const ws = Math.min(spots.length, MAX_SPOTS), wd = windowHalfWidth(src, n);
    for (let i = 0; i < ws; i++) { WA[i] = Math.max(S[0], spots[i] - wd); WB[i] = Math.min(S[ns], spots[i] + wd); }
    // one view of the trial's table: a window measure started at the region holding wa (R[i]) reads only
    // the times and numbers of the entries [k0, k1) of its window (to the first entry ≥ wb), so only those
    // need to be filled and decoded
    const view = viewOf(n, this.hermite);
    view.origins.proxy = this.P;
    if (ws > 0 && n > WINDOW_MIN_ENTRIES) {
      for (let i = 0; i < ws; i++) { K0[i] = Math.max(0, this.lb(WA[i]) - 1); K1[i] = Math.min(n, this.lb(WB[i]) + 1); R[i] = this.regionAt(WA[i]); }
      if (this.unorm) {
        this.pieces ??= makePieces(src, this.P);
        const d = this.quantizeShift(n);
        if (d < 0.5 * tol) {
          // each window filled when it is reached: most counts are rejected by the first
          for (let i = 0; i < ws; i++) {
            const k0 = K0[i], k1 = K1[i];
            this.fillRange(k0, k1);
            decode(null, null, k0, k1, this.hermite);
            setShifts(view.origins, null, null);
            const w = window(view, tol + d, WA[i], WB[i], R[i]);
            if (w > tol + d) return { e: w - d, fullAt: null, spot: i };
          }
        }
        const [vlo, vhi] = this.extremes(0, n);
        qv = makeQuantizer_(e, vlo, vhi);
        if (this.hermite) { const [mlo, mhi] = this.extremes(1, n); qm = makeQuantizer_(e, mlo, mhi); }
      }
      for (let i = 0; i < ws; i++) {
        const k0 = K0[i], k1 = K1[i];
        this.fillRange(k0, k1);
        decode(qv, qm, k0, k1, this.hermite);
        setShifts(view.origins, qv, qm);
        const w = window(view, tol, WA[i], WB[i], R[i]);
        if (w > tol) return { e: w, fullAt: null, spot: i };
      }
    }
    for (let k = 0; k < n; k++) T[k] = A + k * h;
    T[n - 1] = B;
    // every entry: the forward walk of fillEntries (the same numbers as fill, without a search per entry),
    // straight into the view's arrays and decoded there (the raw numbers are not needed again this trial)
    const V = view.values, Ms = view.slopes;
    fillEntries(src, this.P, view.times, V, Ms, this.breaks, undefined, view.origins.fn);
    if (!qv) {
      // the extremes of every entry directly (the same numbers extremes() finds)
      const [vlo, vhi] = minMax_(V);
      qv = makeQuantizer_(e, vlo, vhi);
      if (Ms) { const [mlo, mhi] = minMax_(Ms); qm = makeQuantizer_(e, mlo, mhi); }
    }
    roundTrip(qv, V, 0, n);
    if (Ms && qm) roundTrip(qm, Ms, 0, n);
    setShifts(view.origins, qv, qm);
    // a small table is filled whole, but the windows still reject most counts before the whole measure
    if (n <= WINDOW_MIN_ENTRIES) {
      for (let i = 0; i < ws; i++) {
        const w = window(view, tol, WA[i], WB[i], this.regionAt(WA[i]));
        if (w > tol) return { e: w, fullAt: null, spot: i };
      }
    }
    const m = full(view);
    return { e: m.e, fullAt: m.at, spot: -1 };
  }

  /** Fill the entries of [k0, k1) not yet filled in this trial. */
  private fillRange(k0: number, k1: number): void {
    // the filled ends are left as they are; the rest is filled as one run with fillEntries' forward walk
    // (an entry already filled inside it gets the same numbers again)
    while (k0 < k1 && STAMP[k0] === stamp) k0++;
    while (k1 > k0 && STAMP[k1 - 1] === stamp) k1--;
    if (k0 >= k1) return;
    for (let k = k0; k < k1; k++) { T[k] = this.tAt(k); STAMP[k] = stamp; }
    fillRun(this.src, this.P, T, this.n, k0, k1, this.h, XV, this.hermite ? XM : null, this.breaks, undefined, FN);
  }

  /**
   * δ of run()'s raw window test for n entries: how far quantizing can move the table (Infinity when a
   * range is not a number). The numbers are within the ranges of the pieces with finite ranges, the
   * entries special() takes and those of the pieces without (slivers next to a vertical tangent, which
   * rarely hold an entry), taken here. The rounding of the quantizer's arithmetic is covered by a margin
   * far above it.
   */
  private quantizeShift(n: number): number {
    const P = this.pieces!, M = unormMax_(this.profile.encoding as 'unorm8' | 'unorm16');
    this.special(0, n);
    this.takeOpen(XV, n);
    const v0 = Math.min(EXT[0], P.all[0]), v1 = Math.max(EXT[1], P.all[1]);
    let d = unormShift(v0, v1, M);
    if (this.hermite) {
      this.special(1, n);
      this.takeOpen(XM, n);
      const m0 = Math.min(EXT[0], P.all[2]), m1 = Math.max(EXT[1], P.all[3]);
      d += (this.h / 4) * unormShift(m0, m1, M);
    }
    // the measure's own rounding on the perturbed numbers (far below this)
    d += 1e-9 * (1 + Math.abs(v0) + Math.abs(v1));
    return d === d ? d : Infinity;
  }

  /** Fold into EXT the entries of the pieces without finite ranges (Pieces.open). */
  private takeOpen(X: Float64Array, n: number): void {
    const P = this.pieces!, open = P.open;
    for (let j = 0; j < open.length; j++) { const q = open[j]; this.takePiece(X, q, this.lb(P.a[q]), this.lb(P.b[q]), false, n); }
  }

  /** Fold into EXT (reset first) the entries not read from a piece's function: outside the domain, and for slopes the last entry and those on breaks. */
  private special(o: 0 | 1, n: number): void {
    const X = o === 0 ? XV : XM;
    EXT[0] = Infinity; EXT[1] = -Infinity;
    const S = this.src.times;
    const kS0 = this.lb(S[0]), kSN = this.lb(S[S.length - 1]);
    this.take(X, 0, kS0);
    this.take(X, kSN, n);
    if (o === 1) {
      this.take(X, n - 1, n);
      const B = this.breaks;
      for (let j = 0; j < B.length; j++) { const k = this.lb(B[j].time); if (k < n && this.tAt(k) === B[j].time) this.take(X, k, k + 1); }
    }
  }

  /** Exact [min, max] over the n entries of the values (o = 0) or slopes (o = 1), filling only where either can be. */
  private extremes(o: 0 | 1, n: number): [number, number] {
    const P = this.pieces!, X = o === 0 ? XV : XM, R = o === 0 ? P.values : P.slopes;
    this.special(o, n);
    const byLo = o === 0 ? P.vLo : P.mLo, byHi = o === 0 ? P.vHi : P.mHi, flat = o === 0 ? P.vFlat : P.mFlat;
    for (let r = 0; r < P.count; r++) {
      const q = byLo[r];
      if (R[2 * q] > EXT[0]) break;
      this.takePiece(X, q, this.lb(P.a[q]), this.lb(P.b[q]), flat[q] === 1, n);
    }
    for (let r = 0; r < P.count; r++) {
      const q = byHi[r];
      if (R[2 * q + 1] < EXT[1]) break;
      this.takePiece(X, q, this.lb(P.a[q]), this.lb(P.b[q]), flat[q] === 1, n);
    }
    return [EXT[0], EXT[1]];
  }

  /**
   * take() for the entries [k0, k1) of piece q: filled as one run (fillRange) when more than two, else
   * each with the piece's segment and leaf (no search). On a
   * flat piece one entry after the piece's start and before the last entry stands for all (the entries
   * that may read another number, on a break at the start or the last, are taken by extremes() itself).
   */
  private takePiece(X: Float64Array, q: number, k0: number, k1: number, flat: boolean, n: number): void {
    const P = this.pieces!, seg = P.seg[q], lf = P.leaf[q];
    if (flat) {
      const k = k0 < n && this.tAt(k0) > P.a[q] ? k0 : k0 + 1;
      if (k < k1 && k < n - 1) { k0 = k; k1 = k + 1; }
    }
    if (k1 - k0 > 2) this.fillRange(k0, k1);
    for (let k = k0; k < k1; k++) {
      if (STAMP[k] !== stamp) this.fillWith(k, seg, lf);
      const x = X[k];
      if (x < EXT[0]) EXT[0] = x;
      if (x > EXT[1]) EXT[1] = x;
    }
  }

  /** Fill entries [k0, k1) and fold X there into EXT (NaN is left out, as minMax does). */
  private take(X: Float64Array, k0: number, k1: number): void {
    for (let k = k0; k < k1; k++) {
      this.fill(k);
      const x = X[k];
      if (x < EXT[0]) EXT[0] = x;
      if (x > EXT[1]) EXT[1] = x;
    }
  }
}
