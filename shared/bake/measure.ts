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
 * - sampled+bound: otherwise (bezier, shapes) the piece is measured against the segment's cubic
 *   stand-ins (./proxy.ts): on each leaf the source is within a proven ε of a cubic q (four-point
 *   interpolation, remainder M4·h⁴/1944), so with e = max |q − p| (exact, as above) the error is in
 *   [e − ε, e + ε]: e + ε is certified, e − ε is the estimate, and the error reported as found is the
 *   true |f − p| where e is largest. ε is at most `slackFraction`·tolerance / 2.
 *   Leaves left without a stand-in (a segment beyond the leaf budget) are sampled: the error g = f − p
 *   at n + 1 equally spaced points of step h'; for |g''| ≤ M on the piece, max |g| ≤ max |g(sample)| +
 *   M·h'²/8 (linear-interpolation remainder, Burden & Faires §3.1, from memory), M = bound(f'') +
 *   max |p''|, h' chosen so the slack is at most `slackFraction`·tolerance. A piece that would need more
 *   than `maxSamples` samples (or whose bound is infinite) is halved, up to 24 times deep and 2000 times
 *   per measurement, so pieces shrink toward the singular point; a piece still unbounded at that depth
 *   is certified by the first-order argument of `sliver`.
 */
import type { BakeSource } from './source';
import { cubicAt, hermiteCoeffs, linearCoeffs, maxAbsCubic, MAX_SLOT, shiftCubic } from './poly';
import { evalTable, type Table } from './table';
import { nextUpF32 } from './encoding';
import { proxyFor, SAMPLED, type Proxy } from './proxy';

// Imported functions used in the hot loops, held in module constants (a CommonJS bundle turns each
// call through an imported binding into a getter call on the exporting module).
const cubicAt_ = cubicAt;
const hermiteCoeffs_ = hermiteCoeffs;
const linearCoeffs_ = linearCoeffs;
const maxAbsCubic_ = maxAbsCubic;
const shiftCubic_ = shiftCubic;
const evalTable_ = evalTable;
const nextUpF32_ = nextUpF32;
const proxyFor_ = proxyFor;

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

/** Default slack of sampled pieces as a fraction of the tolerance (MeasureOptions.slackFraction). */
export const SLACK_FRACTION = 0.05;

/** The distance of the cubic stand-ins (./proxy.ts) a measurement at this tolerance uses. */
export function proxyDistance(tolerance: number, slackFraction = SLACK_FRACTION): number {
  return tolerance * slackFraction;
}

export interface MeasureOptions {
  /** Tolerance the slack is sized against. */
  tolerance: number;
  /** Slack of the sampled pieces as a fraction of the tolerance (default 0.05). */
  slackFraction?: number;
  /** Samples per piece before it is halved instead (default 256). */
  maxSamples?: number;
  /**
   * Estimate only: sampled pieces are sampled at the spacing where the slack would equal the whole
   * tolerance and no slack is added, so `certified` is a lower estimate (a count that fails an estimate
   * surely fails). Exact pieces stay exact.
   */
  estimate?: boolean;
  /** Also compare the end value when the range reaches the domain's end (default true). */
  includeEnd?: boolean;
  /**
   * Optional: the exact source values at the table's entries, knotValues[k] = src.value(knotSegments[k],
   * times[k], 0) (knotSegments[k] = −2 where unknown). A sample that falls exactly on an entry's time in that
   * same segment reads the stored number instead of evaluating the source again (the same double).
   */
  knotValues?: Float64Array;
  knotSegments?: Int32Array;
  /**
   * Stop as soon as `certified` exceeds this value (a search that only asks "within tolerance?" needs no
   * more): the returned figures then cover the pieces measured so far, so `certified` is still above
   * `stopAbove` and `maxError` is still an error that really occurs. Default: measure everything.
   */
  stopAbove?: number;
  /**
   * Optional: the table region holding `from` (the largest k with times[k] ≤ from, −1 when none), when the
   * caller knows it. The measure then starts there instead of searching the times, and reads no time or
   * number of an entry before it (nor past the first entry at or after `to`).
   */
  startRegion?: number;
  /**
   * With `estimate` and `stopAbove`: only whether the estimate exceeds stopAbove
   * is asked. A piece whose estimate figure cannot exceed stopAbove is then skipped even where it could
   * raise the figures found so far: a measurement that stops returns the same figures as without this
   * (the first piece above stopAbove, in the same order, is the largest), one that does not stop returns
   * figures ≤ stopAbove that need not be the largest error.
   */
  decideOnly?: boolean;
}

/**
 * Where a table's entries were read from (optional on a table view): per entry, fn[k] = a stand-in leaf
 * index ≥ 0 of `proxy` (the value and the slope of that leaf's cubic), −2 − i for source segment i's own
 * cubic, or −1 (anything else: a break, the last entry, outside the domain, the source itself). The
 * decoded numbers differ from the numbers read by at most shiftV + rel·|v̂| (values) and shiftM + rel·|m̂|
 * (slopes), v̂, m̂ the decoded numbers. With it a region whose two entries come from one cubic g is
 * bounded without being measured (see insideSkips).
 */
export interface EntryOrigins {
  fn: Int32Array;
  proxy: Proxy | null;
  shiftV: number;
  shiftM: number;
  rel: number;
}

type TableView = Pick<Table, 'kernel' | 'times' | 'values' | 'slopes'> & { origins?: EntryOrigins | null };

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
  if (tab.kernel === 'hermite' && tab.slopes) hermiteCoeffs_(V[k], tab.slopes[k], V[k + 1], tab.slopes[k + 1], H, TAB);
  else linearCoeffs_(V[k], V[k + 1], H, TAB);
  return shiftCubic_(TAB, x0 - T[k]);
}

/**
 * Whether the regions k … k1 − 1, whose entries k … k1 were all read from one cubic g (coefficients
 * c[o..o+3] about the start of g's interval of length Lg; EntryOrigins), can be skipped: whether a bound
 * of the figure max |g − p| the measure would compute on any piece of them cannot change the figures
 * found so far, by the rule exactPiece and proxyPiece apply to a measured piece (cannotChange; Ek the
 * stand-in leaf's distance, 0 for the segment's own cubic; `estimate` as the measurement's).
 *
 * The bound: a cubic is its own Hermite interpolant, so for the hermite kernel p − g is the Hermite
 * interpolant of the entries' differences from g: |p − g| ≤ δv + H·δm/4 (the value weights are ≥ 0 and
 * sum to 1, |h10| + |h11| = s(1 − s)·H ≤ H/4; as ./bound.ts). For the linear kernel |p − g| ≤ M2·H²/8 + δv,
 * M2 = max |g''| over the regions (g'' is linear: the larger of its sizes at times[k] and times[k1], g's
 * interval starting at org). δv, δm: the most the decoded numbers
 * differ from g's values and slopes (EntryOrigins shifts). Added: 1e-10·(Q + H·Q1 + |v̂| + H·|m̂|), Q and
 * Q1 the term sums of g and g' over its interval, far above every rounding on the way (reading the entries
 * from g, the table's coefficients, the shift to the piece, the difference and its maximum, each a few
 * ulps of these sums). H is the largest width over the regions; |v̂| and |m̂| are bounded by Q and Q1
 * (the numbers were read from g and g' on its interval) with the shifts, so no entry is read.
 */
function insideSkips(c: Float64Array, o: number, Lg: number, org: number, T: Float64Array, hermite: boolean, k: number, k1: number, O: EntryOrigins, Ek: number, estimate: boolean): boolean {
  let H = 0;
  for (let j = k; j < k1; j++) { const w = T[j + 1] - T[j]; if (w > H) H = w; }
  const c0 = Math.abs(c[o]), c1 = Math.abs(c[o + 1]), c2 = Math.abs(c[o + 2]), c3 = Math.abs(c[o + 3]);
  const Q = c0 + Lg * (c1 + Lg * (c2 + Lg * c3)), Q1 = c1 + Lg * (2 * c2 + 3 * Lg * c3);
  // the decoded numbers' sizes, bounded without reading them: the numbers read are g and g' on its
  // interval (at most Q and Q1), and decoding moves them by at most the shifts
  const vm = Q * (1 + O.rel) + O.shiftV, mm = hermite ? Q1 * (1 + O.rel) + O.shiftM : 0;
  let fit: number;
  if (hermite) {
    fit = (H * (O.shiftM + O.rel * mm)) / 4;
  } else {
    // g'' is linear: its largest size over the regions' span is at one of the span's ends
    const g0 = Math.abs(2 * c[o + 2] + 6 * c[o + 3] * (T[k] - org)), g1 = Math.abs(2 * c[o + 2] + 6 * c[o + 3] * (T[k1] - org));
    fit = ((g0 > g1 ? g0 : g1) * H * H) / 8;
  }
  return cannotChange(O.shiftV + O.rel * vm + fit + 1e-10 * (Q + H * Q1 + vm + H * mm) + 1e-300, Ek, estimate);
}

/**
 * Whether a piece whose computed maximum e = max |g − p| is at most ub cannot change the figures found so
 * far (Ek: the stand-in leaf's distance, 0 for an exact piece): the estimate records e − Ek, the
 * certifying measure e + Ek; record() keeps the first of equal figures, so such a piece is skipped with
 * every result the same. With MeasureOptions.decideOnly, also any piece whose estimate figure cannot
 * exceed the stopping figure.
 */
function cannotChange(ub: number, Ek: number, estimate: boolean): boolean {
  if (ub - Ek <= FIG[FLOOR]) return true;
  return estimate
    ? ub - Ek <= FIG[ERR] && ub - Ek <= FIG[CERT]
    : ub <= FIG[ERR] && ub + Ek <= FIG[CERT];
}

/**
 * State shared by one measurement (kept in module slots to avoid allocation). The figures are in a typed
 * array: the largest error (FIG[ERR]) and its time (FIG[AT]), the certified figure (FIG[CERT]), and the
 * figure MeasureOptions.decideOnly skips a piece at or below (FIG[FLOOR], −Infinity: off). A double kept in a
 * module variable is a heap number that each assignment allocates anew; a typed array's slots are written
 * in place.
 */
const ERR = 0, AT = 1, CERT = 2, FLOOR = 3;
const FIG = new Float64Array([0, 0, 0, -Infinity]);
let sampledUsed = false;
/** The stand-in leaf proxyPiece started from last in this measurement (−1: none yet). */
let leafCursor = -1;
/** Halvings left in this measurement (bounds that stay infinite over a whole range would otherwise split forever). */
let splitBudget = 0;
/**
 * Fold one piece's figures in. A NaN error (a non-finite table or source number) counts as +Infinity:
 * `NaN > x` is false, so without this a NaN piece would count as 0 and the table would pass.
 */
export function record(err: number, at: number, cert: number): void {
  if (err !== err) err = Infinity;
  if (cert !== cert) cert = Infinity;
  if (err > FIG[ERR]) { FIG[ERR] = err; FIG[AT] = at; }
  if (cert > FIG[CERT]) FIG[CERT] = cert;
}

/** The figures record() has folded in since the last reset (for tests of the NaN rule). */
export function recorded(): { maxError: number; certified: number } { return { maxError: FIG[ERR], certified: FIG[CERT] }; }
/** Reset the figures record() folds into (measureError does this itself). */
export function resetRecord(): void { FIG[ERR] = 0; FIG[AT] = 0; FIG[CERT] = 0; }

/**
 * DIFF = g(· + s) − p(· + r): the cubic g whose coefficients start at c[o] re-expanded about s, minus the
 * table cubic TAB re-expanded about r, each as shiftCubic does it (./poly.ts), in locals.
 */
function diffInto(c: Float64Array, o: number, s: number, r: number): void {
  let q0 = c[o], q1 = c[o + 1], q2 = c[o + 2];
  const q3 = c[o + 3];
  if (s !== 0) {
    q0 = q0 + s * (q1 + s * (q2 + s * q3));
    q1 = q1 + s * (2 * q2 + 3 * s * q3);
    q2 = q2 + 3 * s * q3;
  }
  let p0 = TAB[0], p1 = TAB[1], p2 = TAB[2];
  const p3 = TAB[3];
  if (r !== 0) {
    p0 = p0 + r * (p1 + r * (p2 + r * p3));
    p1 = p1 + r * (2 * p2 + 3 * r * p3);
    p2 = p2 + 3 * r * p3;
  }
  DIFF[0] = q0 - p0; DIFF[1] = q1 - p1; DIFF[2] = q2 - p2; DIFF[3] = q3 - p3;
}

/** Exact piece: the source cubic p of its segment (about the segment's start s0) minus the table cubic (TAB already at origin x0). */
function exactPiece(p: Float64Array, s0: number, x0: number, x1: number): void {
  diffInto(p, 0, x0 - s0, 0);
  const L = x1 - x0;
  // a piece whose error cannot reach the figures already found changes nothing (see cubicBound)
  // (with Ek = 0 both of cannotChange's rules are the same: the figures of an exact piece are e itself)
  if (cannotChange(cubicBound(DIFF[0], DIFF[1], DIFF[2], DIFF[3], L), 0, true)) return;
  const e = maxAbsCubic_(DIFF, L);
  record(e, x0 + MAX_SLOT[1], e);
}

/**
 * An upper bound of max |d(u)| over [0, L] for d(u) = d0 + d1·u + d2·u² + d3·u³, as maxAbsCubic computes
 * it. In Bernstein form on [0, L] the cubic lies in the convex hull of its coefficients b0 = d0,
 * b1 = d0 + a1/3, b2 = d0 + (2a1 + a2)/3, b3 = d0 + a1 + a2 + a3 with aⱼ = dⱼ·Lʲ (Farin, Curves and
 * Surfaces for CAGD, §5 — from memory), so max |d| ≤ max |bᵢ|. Added: 1e-12·(|d0| + |a1| + |a2| + |a3|)
 * + 1e-300, far above the rounding of these sums and of the maximum maxAbsCubic evaluates in doubles
 * (Horner's rule at u ∈ [0, L] errs by a few ulps of that sum). A piece whose bound is at most both
 * figures recorded so far cannot change them (record() keeps the first of equal errors), so skipping it
 * leaves every result the same. NaN never skips.
 */
export function cubicBound(d0: number, d1: number, d2: number, d3: number, L: number): number {
  const a1 = d1 * L, a2 = d2 * L * L, a3 = d3 * L * L * L;
  const b1 = d0 + a1 / 3, b2 = d0 + (2 * a1 + a2) / 3, b3 = d0 + a1 + a2 + a3;
  let m = Math.abs(d0);
  const m1 = Math.abs(b1), m2 = Math.abs(b2), m3 = Math.abs(b3);
  if (!(m1 <= m)) m = m1;
  if (!(m2 <= m)) m = m2;
  if (!(m3 <= m)) m = m3;
  return m + 1e-12 * (Math.abs(d0) + Math.abs(a1) + Math.abs(a2) + Math.abs(a3)) + 1e-300;
}

/**
 * Known source values at the current table region's two entries (MeasureOptions.knotValues): time
 * (KNOWN[KT0], KNOWN[KT1]; NaN: none), segment the value was taken from (hS0, hS1; −2: none) and the value
 * src.value(segment, time, 0) itself (KNOWN[KV0], KNOWN[KV1]).
 */
const KT0 = 0, KV0 = 1, KT1 = 2, KV1 = 3;
const KNOWN = new Float64Array([Number.NaN, 0, Number.NaN, 0]);
let hS0 = -2, hS1 = -2;

/** |f − p| at t (TAB holds the table cubic about `origin`). */
function gAt(src: BakeSource, i: number, t: number, origin: number): number {
  const f = t === KNOWN[KT0] && i === hS0 ? KNOWN[KV0] : t === KNOWN[KT1] && i === hS1 ? KNOWN[KV1] : src.value(i, t, 0);
  const e = Math.abs(f - cubicAt_(TAB, t - origin));
  return e === e ? e : Infinity; // NaN counts as failure
}

/** max |p''| and max |p'| of the table cubic on [x0, x1] (linear in u for p''; p' bounded by |c1| + 2|c2|u + 3|c3|u²). */
function tabM2(origin: number, x0: number, x1: number): number {
  const u0 = x0 - origin, u1 = x1 - origin;
  return Math.max(Math.abs(2 * TAB[2] + 6 * TAB[3] * u0), Math.abs(2 * TAB[2] + 6 * TAB[3] * u1));
}
function tabM1(origin: number, x1: number): number {
  const u = Math.abs(x1 - origin);
  return Math.abs(TAB[1]) + 2 * Math.abs(TAB[2]) * u + 3 * Math.abs(TAB[3]) * u * u;
}

/**
 * A sliver [a, b] next to a point where the source's second derivative is unbounded:
 * |g(t)| ≤ |g(a)| + (M1_f + M1_p)·(b − a) when the slope bound M1_f is finite; where the slope itself is
 * unbounded (a vertical tangent, e.g. circ at its ends) the source is taken as monotone on the sliver, so
 * |g| ≤ max(|g(a)|, |g(b)|) + |f(b) − f(a)| + M1_p·(b − a).
 */
function sliver(src: BakeSource, i: number, a: number, b: number, origin: number): void {
  const ga = gAt(src, i, a, origin), gb = gAt(src, i, b, origin);
  const w = b - a;
  const M1 = src.bound(i, 1, a, b);
  const p1 = tabM1(origin, Math.max(Math.abs(a - origin), Math.abs(b - origin)) + origin);
  const base = Math.max(ga, gb);
  const cert = Number.isFinite(M1)
    ? Math.min(ga, gb) + (M1 + p1) * w
    : base + Math.abs(src.value(i, b, 0) - src.value(i, a, 0)) + p1 * w;
  record(base, ga >= gb ? a : b, Math.max(base, cert));
}

/** Sampled piece [x0, x1] with the second-derivative slack; TAB holds the table cubic about `origin`. */
function sampledPiece(
  src: BakeSource, i: number, x0: number, x1: number, origin: number, slackAbs: number, maxSamples: number, estimate: boolean, depth: number,
): void {
  sampledUsed = true;
  const L = x1 - x0;
  const M = src.bound(i, 2, x0, x1) + tabM2(origin, x0, x1);
  if (!estimate) {
    const need = Number.isFinite(M) ? Math.ceil(L / Math.sqrt((8 * slackAbs) / M)) : Infinity;
    if (need > maxSamples) {
      if (depth < 24 && splitBudget > 0) {
        splitBudget--;
        // halve: near a joint or a vertical tangent the halves shrink toward it (graded subdivision)
        const xm = x0 + L / 2;
        sampledPiece(src, i, x0, xm, origin, slackAbs, maxSamples, estimate, depth + 1);
        sampledPiece(src, i, xm, x1, origin, slackAbs, maxSamples, estimate, depth + 1);
        return;
      }
      if (!Number.isFinite(M)) { sliver(src, i, x0, x1, origin); return; }
    }
  }
  const W = x1 - x0;
  let n = estimate ? 32 : maxSamples;
  if (M > 0 && Number.isFinite(M)) n = Math.min(estimate ? 64 : maxSamples, Math.max(1, Math.ceil(W / Math.sqrt((8 * slackAbs) / M))));
  else if (M === 0) n = 1;
  const h = W / n;
  let localMax = 0, localAt = x0;
  for (let j = 0; j <= n; j++) {
    const t = j === n ? x1 : x0 + j * h;
    const e = gAt(src, i, t, origin);
    if (e > localMax) { localMax = e; localAt = t; }
  }
  const slack = estimate ? 0 : Number.isFinite(M) ? (M * h * h) / 8 : Infinity;
  record(localMax, localAt, localMax + slack);
}

/**
 * A piece [x0, x1] of a sampled segment i, measured against the segment's cubic stand-ins (./proxy.ts):
 * on each leaf overlap, e = max |q − p| exactly; the error there is within e ± ε (the leaf's proven
 * distance), so the certified figure is e + ε, and the estimate (a lower bound) e − ε. The error reported
 * as found is the true |f − p| at the place of the largest e (one source evaluation when it leads).
 * Leaves left to sampling go to sampledPiece. TAB holds the table cubic about x0.
 */
function proxyPiece(
  src: BakeSource, P: Proxy, i: number, x0: number, x1: number, slackAbs: number, maxSamples: number, estimate: boolean,
): void {
  sampledUsed = true;
  const A = P.a, Bq = P.b, C = P.c, E = P.err, end = P.first[i + 1];
  // the first leaf of segment i ending after x0: pieces come in increasing x0, so the leaf cursor of the
  // measurement only moves forward (the same leaf a bisection over the segment's leaves finds)
  let lo = leafCursor < P.first[i] ? P.first[i] : leafCursor;
  while (lo < end && Bq[lo] <= x0) lo++;
  leafCursor = lo;
  for (let k = lo; k < end && A[k] < x1; k++) {
    const y0 = A[k] > x0 ? A[k] : x0, y1 = Bq[k] < x1 ? Bq[k] : x1;
    if (!(y1 > y0)) continue;
    if (P.kind[k] === SAMPLED) { sampledPiece(src, i, y0, y1, x0, slackAbs, maxSamples, estimate, 0); continue; }
    // the leaf's cubic and the table's, both shifted to y0
    diffInto(C, 4 * k, y0 - A[k], y0 - x0);
    const L = y1 - y0, Ek = E[k];
    // skip a leaf whose figures cannot exceed those found so far (cubicBound); the estimate records e − ε, the proof e + ε
    if (cannotChange(cubicBound(DIFF[0], DIFF[1], DIFF[2], DIFF[3], L), Ek, estimate)) continue;
    const e = maxAbsCubic_(DIFF, L);
    const at = y0 + MAX_SLOT[1];
    if (estimate) {
      const low = e - E[k] > 0 ? e - E[k] : 0;
      record(low, at, low);
    } else if (e > FIG[ERR] || e !== e) {
      record(gAt(src, i, at, x0), at, e + E[k]);
    } else {
      record(0, at, e + E[k]);
    }
  }
}

/**
 * Maximum error of `tab` against `src` on [from, to] (default: the source's whole domain).
 * Allocation-free apart from the returned object.
 */
export function measureError(src: BakeSource, tab: TableView, opts: MeasureOptions, from?: number, to?: number): ErrorMeasure {
  measureInto(src, tab, opts, from, to);
  return { maxError: FIG[ERR], at: FIG[AT], certified: FIG[CERT], method: sampledUsed ? 'sampled+bound' : 'exact' };
}

/** measureError's `certified` figure alone, without allocating (searches that only compare it with a tolerance). */
export function measureCertified(src: BakeSource, tab: TableView, opts: MeasureOptions, from?: number, to?: number): number {
  measureInto(src, tab, opts, from, to);
  return FIG[CERT];
}

/** The measurement itself: leaves its figures in the module state (FIG, sampledUsed). */
function measureInto(src: BakeSource, tab: TableView, opts: MeasureOptions, from?: number, to?: number): void {
  const S = src.times;
  const ns = S.length - 1;
  const A = from ?? S[0];
  const B = to ?? S[ns];
  const estimate = opts.estimate === true;
  const tolAbs = opts.tolerance;
  const slackAbs = proxyDistance(opts.tolerance, opts.slackFraction);
  const maxSamples = opts.maxSamples ?? 256;
  const K = tab.times;
  const Ms = tab.kernel === 'hermite' && tab.slopes ? tab.slopes : null;
  const nk = K.length;
  const O = tab.origins ?? null, F = O ? O.fn : null;
  // regions before this one were in a run of regions inside one cubic whose bound was checked
  let runChecked = -1;
  FIG[ERR] = 0; FIG[AT] = A; FIG[CERT] = 0; sampledUsed = false; splitBudget = 2000; leafCursor = -1;
  FIG[FLOOR] = estimate && opts.decideOnly === true && opts.stopAbove !== undefined ? opts.stopAbove : -Infinity;
  // first table region at A
  // the largest k with K[k] ≤ A (−1 when none; K is non-decreasing), by bisection
  let k = -1;
  if (opts.startRegion !== undefined) k = opts.startRegion;
  else {
    let lo = 0, hi = nk;
    while (lo < hi) { const mid = (lo + hi) >> 1; if (K[mid] <= A) lo = mid + 1; else hi = mid; }
    k = lo - 1;
  }
  const cuts = src.cuts;
  let c = 0;
  const stopAbove = opts.stopAbove ?? Infinity;
  const KV = opts.knotValues && opts.knotSegments ? opts.knotValues : null;
  const KS = opts.knotSegments;
  KNOWN[KT0] = KNOWN[KT1] = Number.NaN; hS0 = hS1 = -2;
  let proxy: Proxy | null = null;
  pieces: for (let i = 0; i < ns; i++) {
    const a = Math.max(S[i], A), b = Math.min(S[i + 1], B);
    if (!(b > a)) continue;
    const poly = src.poly(i), exact = poly !== null, s0 = S[i];
    // walk table regions overlapping [a, b]
    while (k >= 0 && K[k] > a) k--;
    while (k + 1 < nk && K[k + 1] <= a) k++;
    let x0 = a;
    while (x0 < b) {
      const hi = k + 1 < nk ? K[k + 1] : Infinity;
      let x1 = Math.min(b, hi);
      if (cuts) {
        while (c < cuts.length && cuts[c] <= x0) c++;
        if (c < cuts.length && cuts[c] < x1) x1 = cuts[c];
      }
      if (x1 > x0 && nextUpF32_(x0) < x1) {
        // a region inside one cubic the entries were read from: skipped when its bound cannot change the
        // figures, and with it the rest of the run of regions inside that cubic when their bound cannot
        // (insideSkips; the run is checked once: where it fails, its regions are checked one by one)
        if (F && k >= 0 && k + 1 < nk && F[k] !== -1 && F[k] === F[k + 1]) {
          const f = F[k];
          let g: Float64Array | null = null, go = 0, Lg = 0, org = 0, Ek = 0;
          if (exact && f === -2 - i) { g = poly; Lg = S[i + 1] - S[i]; org = S[i]; }
          else if (!exact && f >= 0) {
            if (!proxy) proxy = proxyFor_(src, slackAbs);
            if (O!.proxy === proxy && f >= proxy.first[i] && f < proxy.first[i + 1]) { g = proxy.c; go = 4 * f; Lg = proxy.b[f] - proxy.a[f]; org = proxy.a[f]; Ek = proxy.err[f]; }
          }
          if (g) {
            // end: the first region not skipped (0: none skipped)
            let end = 0;
            if (k >= runChecked) {
              let last = k + 1;
              // (no further than the first entry at or after B: the measure reads nothing past it)
              while (last + 1 < nk && K[last] < B && F[last + 1] === f) last++;
              runChecked = last;
              if (last > k + 1 && insideSkips(g, go, Lg, org, K, Ms !== null, k, last, O!, Ek, estimate)) end = last;
            }
            if (end === 0 && insideSkips(g, go, Lg, org, K, Ms !== null, k, k + 1, O!, Ek, estimate)) end = k + 1;
            if (end > 0) {
              if (!exact) sampledUsed = true;
              x1 = K[end] < b ? K[end] : b;
              if (x1 >= b) break;
              x0 = x1;
              while (k + 1 < nk && K[k + 1] <= x0) k++;
              continue;
            }
          }
        }
        tableCoeffs(tab, k, x0);
        if (KV && k >= 0 && k + 1 < nk) {
          KNOWN[KT0] = K[k]; hS0 = KS![k]; KNOWN[KV0] = KV[k];
          KNOWN[KT1] = K[k + 1]; hS1 = KS![k + 1]; KNOWN[KV1] = KV[k + 1];
        } else { KNOWN[KT0] = KNOWN[KT1] = Number.NaN; }
        if (exact) exactPiece(poly, s0, x0, x1);
        else {
          if (!proxy) proxy = proxyFor_(src, slackAbs);
          proxyPiece(src, proxy, i, x0, x1, estimate ? tolAbs : slackAbs, maxSamples, estimate);
        }
        if (FIG[CERT] > stopAbove) break pieces;
      }
      if (x1 >= b) break;
      x0 = x1;
      while (k + 1 < nk && K[k + 1] <= x0) k++;
    }
  }
  // the end point itself (a step into the last key shows only there)
  if (FIG[CERT] > stopAbove) return;
  if (opts.includeEnd !== false && (to === undefined || to >= S[ns])) {
    const e = Math.abs(src.endValue - evalTable_(tab, B));
    record(e, B, e);
  }
}
