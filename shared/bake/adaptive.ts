/**
 * Adaptive layout: knots where the curve needs them, times stored (float32).
 *
 * 1. Forced knots on every jump and slope break (./breaks.ts, order ≤ 1) and at both ends. A jump is
 *    stored as two entries with the same time (left limit, then right value) at the smallest float32
 *    time ≥ the jump, so every float32 time sees the same side as the source; a slope break as two
 *    entries with the same time and value (in-slope, then out-slope; the linear kernel needs one).
 * 2. Between forced knots, greedy placement: from knot a the first trial width comes from the local
 *    bound (h = (384·tol/2/M4)^¼ hermite, √(8·tol/2/M2) linear, M from the source segment at a; later
 *    the previous width); then ./widest.ts finds the widest next interval the measure accepts, to 0.2 %,
 *    by predicting the crossing from the measured errors (error ∝ width^p) with bisection as safeguard.
 * 3. Merge: the knot before each forced knot is removed when the merged interval still passes.
 * 4. Refine: every interval is certified with the full measure (exact, or sampled+bound); one that
 *    misses is halved until it passes. For sampled sources the greedy step uses the cheap estimate
 *    (no slack) against 0.95·tolerance, so refinement is rare.
 * Knot values/slopes are the source's exact one-sided values at the knot (a slope that is not finite,
 * at a vertical tangent, is the secant over 2⁻¹⁶ of the domain into the segment: ./slopes.ts); unorm offset/scale come from
 * the source's value and slope ranges, so each interval is measured with its final encoding.
 */
import type { BakeSource } from './source';
import type { Profile } from './profile';
import type { Break } from './breaks';
import { measureCertified, measureError, type ErrorMeasure } from './measure';
import type { Table } from './table';
import { assembleTable, leftSlope, leftValue, rightSlope, rightValue } from './knots';
import { finiteSlope } from './slopes';
import { boundOrder, widthForTolerance } from './bound';
import { widestWidth } from './widest';
import { ceilF32, encodeOne, decodeOne, makeQuantizer, type Quantizer } from './encoding';
import { sourceRange } from './ranges';
import { segmentAt } from './source';

export interface AdaptiveResult { table: Table; measure: ErrorMeasure }

/** Fraction of the domain a vertical tangent's knot takes its secant slope over (./slopes.ts). */
const SECANT_FRACTION = 2 ** -16;

interface Knot { stored: number; src: number; v: number; m: number; forced: boolean }

const VIEW_T = new Float64Array(2);
const VIEW_V = new Float64Array(2);
const VIEW_M = new Float64Array(2);

export function bakeAdaptive(src: BakeSource, profile: Profile, tol: number, breaks: readonly Break[]): AdaptiveResult | string {
  const S = src.times;
  const A = S[0], B = S[S.length - 1];
  const hermite = profile.kernel === 'hermite';
  // secant width of a knot whose source slope is not finite (a vertical tangent; ./slopes.ts)
  const SW = (B - A) * SECANT_FRACTION;
  // unorm offset/scale from the source's ranges; f32 and f16 need no range (their quantizer ignores it)
  const unorm = profile.encoding === 'unorm8' || profile.encoding === 'unorm16';
  const vr = unorm ? sourceRange(src, 0) : { min: 0, max: 0 };
  const qv = makeQuantizer(profile.encoding, vr.min, vr.max);
  let qm: Quantizer | undefined;
  if (hermite) {
    const mr = unorm ? sourceRange(src, 1) : { min: 0, max: 0 };
    qm = makeQuantizer(profile.encoding, mr.min, mr.max);
  }
  const rt = (q: Quantizer, x: number) => decodeOne(q, encodeOne(q, x));
  const forcedTimes = breaks.filter((b) => b.order <= 1);
  const view = { kernel: profile.kernel, times: VIEW_T, values: VIEW_V, slopes: hermite ? VIEW_M : null };
  const opts = { tolerance: tol };
  let hasSampled = false;
  for (let i = 0; i < S.length - 1; i++) if (S[i + 1] > S[i] && !src.poly(i)) hasSampled = true;
  // greedy placement uses the cheap estimate where the source is sampled; intervals are certified afterwards
  const intervalOpts = { tolerance: tol, includeEnd: false, estimate: hasSampled };
  const certOpts = { tolerance: tol, includeEnd: false };

  const target = hasSampled ? 0.95 * tol : tol;
  {
    const knots: Knot[] = [];
    // one interval [a, b] (a: right values at a.src; b: left values at bSrc) within target?
    // the error figure of one interval [a, b] (a: right values at a.src; b: left values at b); NaN → Infinity
    const intervalError = (a: Knot, bStored: number, bv: number, bm: number): number => {
      VIEW_T[0] = a.stored; VIEW_T[1] = bStored;
      VIEW_V[0] = rt(qv, a.v); VIEW_V[1] = rt(qv, bv);
      if (hermite) { VIEW_M[0] = rt(qm!, a.m); VIEW_M[1] = rt(qm!, bm); }
      const e = measureCertified(src, view, intervalOpts, a.stored, bStored === Math.fround(B) ? B : bStored);
      return e === e ? e : Infinity;
    };
    const intervalOk = (a: Knot, bStored: number, bv: number, bm: number): boolean => intervalError(a, bStored, bv, bm) <= target;
    // the error of the interval from knot `from` to from.src + w (Infinity when that time is not inside the span)
    let from: Knot, spanEnd = 0;
    const errAt = (w: number): number => {
      const t = Math.fround(from.src + w);
      if (!(t > from.stored) || !(t < spanEnd)) return Infinity;
      return intervalError(from, t, leftValue(src, t, 0), hermite ? leftSlope(src, t, SW) : 0);
    };
    const power = boundOrder(profile.kernel);
    let failure: string | null = null;
    const spanEnds: { stored: number; src: number; br: Break | null }[] = forcedTimes
      .map((br) => ({ stored: br.order === 0 ? ceilF32(br.time) : Math.fround(br.time), src: br.time, br }));
    if (!spanEnds.length || spanEnds[spanEnds.length - 1].src < B) spanEnds.push({ stored: Math.fround(B), src: B, br: null });
    let a: Knot = { stored: Math.fround(A), src: A, v: rightValue(src, A, 0), m: hermite ? rightSlope(src, A, SW) : 0, forced: true };
    knots.push(a);
    for (const end of spanEnds) {
      const endV = leftValue(src, end.src, 0), endM = hermite ? leftSlope(src, end.src, SW) : 0;
      const spanStart = knots.length - 1;
      let h = 0;
      while (a.stored < end.stored) {
        if (intervalOk(a, end.stored, endV, endM)) break; // the rest of the span fits
        // first guess from the local bound (or the previous width)
        if (!(h > 0)) {
          const i = segmentAt(src, a.src);
          const M = src.bound(i, boundOrder(profile.kernel), a.src, Math.min(S[i + 1], end.src));
          h = Number.isFinite(M) ? widthForTolerance(profile.kernel, M, target / 2) : NaN;
          if (!(h > 0) || !Number.isFinite(h)) h = (end.src - a.src) / 2;
        }
        const span = end.src - a.src;
        h = Math.min(Math.max(h, span * 1e-6), span / 2);
        from = a; spanEnd = end.stored;
        const lo = widestWidth(errAt, target, h, span, power, span * 1e-7);
        if (lo < 0) { failure = `curve "${src.name}": cannot stay within ${tol.toPrecision(3)} near t = ${a.src} s (the encoding's round-off is too large for the tolerance)`; break; }
        const t = Math.fround(a.src + lo);
        h = lo;
        a = { stored: t, src: t, v: rightValue(src, t, 0), m: hermite ? rightSlope(src, t, SW) : 0, forced: false };
        knots.push(a);
      }
      if (failure) break;
      // merge: drop the last free knot of the span when the merged interval passes
      if (knots.length - 1 > spanStart + 1) {
        const last = knots[knots.length - 1], prev = knots[knots.length - 2];
        void last;
        if (intervalOk(prev, end.stored, endV, endM)) knots.pop();
      }
      // close the span with the forced knot(s)
      const leftKnot: Knot = { stored: end.stored, src: end.src, v: endV, m: endM, forced: true };
      knots.push(leftKnot);
      if (end.br) {
        const br = end.br;
        const rv = br.right >= 0 ? src.value(br.right, br.time, 0) : src.endValue;
        let rm = hermite && br.right >= 0 ? finiteSlope(src, br.right, br.time, 1, src.value(br.right, br.time, 1), SW) : endM;
        if (hermite && br.left === br.right) {
          // a joint inside one segment: one-sided slopes just beside it
          const d = 1e-9 * Math.max(1, Math.abs(br.time));
          leftKnot.m = finiteSlope(src, br.left, br.time, -1, src.value(br.left, br.time - d, 1), SW);
          rm = finiteSlope(src, br.right, br.time, 1, src.value(br.right, br.time + d, 1), SW);
        }
        if (br.order === 0 || hermite) knots.push({ stored: end.stored, src: end.src, v: rv, m: rm, forced: true });
        a = knots[knots.length - 1];
      }
    }
    if (failure) return failure;
    // refine: certify every interval with the full measure; halve the ones that miss
    let worst = 0, worstAt = A, cert = 0, sampled = false;
    for (let k = 0; k + 1 < knots.length; ) {
      const a0 = knots[k], b0 = knots[k + 1];
      if (!(b0.stored > a0.stored)) { k++; continue; }
      VIEW_T[0] = a0.stored; VIEW_T[1] = b0.stored;
      VIEW_V[0] = rt(qv, a0.v); VIEW_V[1] = rt(qv, b0.v);
      if (hermite) { VIEW_M[0] = rt(qm!, a0.m); VIEW_M[1] = rt(qm!, b0.m); }
      const m = measureError(src, view, certOpts, a0.stored, b0.stored === Math.fround(B) ? B : b0.stored);
      if (!(m.certified <= tol)) {
        const t = Math.fround(0.5 * (a0.src + b0.src));
        if (!(t > a0.stored && t < b0.stored)) return `curve "${src.name}": cannot prove ${tol.toPrecision(3)} near t = ${a0.src} s`;
        knots.splice(k + 1, 0, { stored: t, src: t, v: rightValue(src, t, 0), m: hermite ? rightSlope(src, t, SW) : 0, forced: false });
        continue;
      }
      if (m.maxError > worst) { worst = m.maxError; worstAt = m.at; }
      if (m.certified > cert) cert = m.certified;
      if (m.method === 'sampled+bound') sampled = true;
      k++;
    }
    const n = knots.length;
    const times = new Float64Array(n), stored = new Float32Array(n), values = new Float64Array(n);
    const slopes = hermite ? new Float64Array(n) : null;
    for (let k = 0; k < n; k++) {
      stored[k] = knots[k].stored; times[k] = stored[k]; values[k] = knots[k].v;
      if (slopes) slopes[k] = knots[k].m;
    }
    const table = assembleTable(profile, times, stored, values, slopes, qv, qm);
    // the end point itself (the last entry's value against the curve's end value)
    let endErr = Math.abs(src.endValue - table.values[n - 1]);
    if (endErr !== endErr) endErr = Infinity; // NaN counts as failure
    if (endErr > worst) { worst = endErr; worstAt = B; }
    if (endErr > cert) cert = endErr;
    if (!(cert <= tol)) return `curve "${src.name}": the end value cannot be stored within ${tol.toPrecision(3)}`;
    void opts;
    return { table, measure: { maxError: worst, at: worstAt, certified: cert, method: sampled ? 'sampled+bound' : 'exact' } };
  }
}
