/**
 * Key reduction: a cubic Hermite curve with few keys that stays within a tolerance of dense samples.
 *
 * Model. Knots τ_0 < … < τ_{K−1} with a value v_k and one (joined) slope m_k each; on [τ_k, τ_{k+1}],
 * h = τ_{k+1} − τ_k, s = (t − τ_k)/h, the cubic Hermite form (Burden & Faires §3.4; glTF 2.0 Appendix C):
 *   p(t) = (2s³−3s²+1)v_k + h(s³−2s²+s)m_k + (−2s³+3s²)v_{k+1} + h(s³−s²)m_{k+1}.
 * p is linear in (v, m), so for fixed knots the least-squares values and slopes solve a banded
 * normal system (each sample touches 4 unknowns: half-bandwidth 3), solved by banded LDLᵀ. A tiny
 * ridge term pulls each slope toward the data's local secant so segments with few samples stay
 * well-posed (weight 1e-9 of the sample terms: it moves a determined fit by far below tolerance).
 *
 * Error. Measured at every sample, and between neighbouring samples (at ¼, ½, ¾ of each gap) against
 * the Catmull-Rom interpolant of the samples (Catmull & Rom 1974; uniform-parameter cardinal form
 * with slopes (y_{i+1} − y_{i−1})/(t_{i+1} − t_{i−1})), the smooth reading of "what the samples say
 * between them"; the reported maxError is the larger of the two.
 *
 * Search. (1) Greedy subdivision: starting from the first and last sample, every segment whose error
 * exceeds the tolerance is split at the sample nearest its middle, and the whole curve is refitted,
 * until all segments pass or no segment can be split. (2) Removal: interior knots are dropped in order
 * of least local error while a local refit (see removeKnots) still meets the tolerance, then the whole
 * curve is refitted. (3) Uniform fit: the smallest number of evenly spaced knots that meets the
 * tolerance is searched too (up to the adaptive count), and the result
 * with fewer keys is returned (so the answer never needs more keys than the uniform least-squares fit).
 */

export interface FitKey {
  time: number;
  value: number;
  slope: number;
}

export interface FitResult {
  keys: FitKey[];
  /** true when maxError ≤ tolerance. */
  ok: boolean;
  tolerance: number;
  /** max(maxErrorAtSamples, maxErrorBetween). */
  maxError: number;
  maxErrorAtSamples: number;
  maxErrorBetween: number;
  /** Keys the smallest passing uniform fit needed (0 when none passed within the search). */
  uniformKeys: number;
  /** 'adaptive' or 'uniform': which search gave the returned keys. */
  method: 'adaptive' | 'uniform';
}

export interface FitOptions {
  /** Hold the first/last value at these numbers exactly (used to keep a segment's end keys). */
  fixStartValue?: number;
  fixEndValue?: number;
  /** Upper bound on the number of keys (default: the number of samples). */
  maxKeys?: number;
}

/** Unknowns held at given numbers in leastSquaresHermite: [index into [v0, m0, v1, m1, …], value]. */
type Fixed = readonly (readonly [number, number])[];

/** Error of a fit: per segment maxima and the totals. */
interface FitError {
  seg: Float64Array;
  atSamples: number;
  between: number;
}

/** Catmull-Rom slopes of the samples (one-sided at the ends): m_i = (y_{i+1} − y_{i−1})/(t_{i+1} − t_{i−1}). */
function sampleSlopes(t: Float64Array, y: Float64Array): Float64Array {
  const n = t.length;
  const m = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const a = i === 0 ? 0 : i - 1;
    const b = i === n - 1 ? n - 1 : i + 1;
    m[i] = (y[b] - y[a]) / (t[b] - t[a]);
  }
  return m;
}

/** Hermite value on one segment (formula in the file header). */
function hermiteAt(v0: number, m0: number, v1: number, m1: number, h: number, s: number): number {
  const s2 = s * s;
  const s3 = s2 * s;
  return (2 * s3 - 3 * s2 + 1) * v0 + h * (s3 - 2 * s2 + s) * m0 + (-2 * s3 + 3 * s2) * v1 + h * (s3 - s2) * m1;
}

/** Linear interpolation of the samples at time x (clamped to the ends). */
function sampleLerp(t: Float64Array, y: Float64Array, x: number): number {
  const n = t.length;
  if (x <= t[0]) return y[0];
  if (x >= t[n - 1]) return y[n - 1];
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (t[mid] <= x) lo = mid;
    else hi = mid;
  }
  return y[lo] + ((x - t[lo]) / (t[hi] - t[lo])) * (y[hi] - y[lo]);
}

/**
 * Least-squares values and slopes at fixed knots (banded normal equations, LDLᵀ).
 * Returns [v_0, m_0, v_1, m_1, …].
 */
export function leastSquaresHermite(
  t: Float64Array, y: Float64Array, knots: Float64Array, opts: FitOptions = {}, fixed: Fixed = [],
): Float64Array {
  const K = knots.length;
  const n = 2 * K;
  const A = new Float64Array(n * 4); // A[i*4 + d] = A(i, i + d)
  const b = new Float64Array(n);
  const basis = new Float64Array(4);
  let k = 0;
  for (let i = 0; i < t.length; i++) {
    const x = t[i];
    while (k < K - 2 && x >= knots[k + 1]) k++;
    const h = knots[k + 1] - knots[k];
    const s = (x - knots[k]) / h;
    const s2 = s * s;
    const s3 = s2 * s;
    basis[0] = 2 * s3 - 3 * s2 + 1;
    basis[1] = h * (s3 - 2 * s2 + s);
    basis[2] = -2 * s3 + 3 * s2;
    basis[3] = h * (s3 - s2);
    const base = 2 * k;
    for (let p = 0; p < 4; p++) {
      b[base + p] += basis[p] * y[i];
      for (let q = p; q < 4; q++) A[(base + p) * 4 + (q - p)] += basis[p] * basis[q];
    }
  }
  // Ridge toward local data: value → linear interpolation, slope → local secant over the knot's
  // neighbourhood; weight 1e-9 relative to the sample terms.
  for (let j = 0; j < K; j++) {
    const left = j > 0 ? knots[j] - knots[j - 1] : knots[1] - knots[0];
    const right = j < K - 1 ? knots[j + 1] - knots[j] : left;
    const w = 0.5 * Math.min(left, right);
    const sl = (sampleLerp(t, y, knots[j] + w) - sampleLerp(t, y, knots[j] - w)) / (2 * w);
    const hh = 0.5 * (left + right);
    const lam = 1e-9 * Math.max(1, t.length / Math.max(1, K));
    A[2 * j * 4] += lam;
    b[2 * j] += lam * sampleLerp(t, y, knots[j]);
    A[(2 * j + 1) * 4] += lam * hh * hh;
    b[2 * j + 1] += lam * hh * hh * sl;
  }
  const fix = (idx: number, c: number) => {
    for (let d = 1; d <= 3; d++) {
      if (idx - d >= 0) { b[idx - d] -= A[(idx - d) * 4 + d] * c; A[(idx - d) * 4 + d] = 0; }
      if (idx + d < n) { b[idx + d] -= A[idx * 4 + d] * c; A[idx * 4 + d] = 0; }
    }
    A[idx * 4] = 1;
    b[idx] = c;
  };
  if (opts.fixStartValue !== undefined) fix(0, opts.fixStartValue);
  if (opts.fixEndValue !== undefined) fix(2 * (K - 1), opts.fixEndValue);
  for (const [idx, c] of fixed) fix(idx, c);
  return solveBanded3(A, b, n);
}

/** Solve A x = b for symmetric positive definite A of half-bandwidth 3 by LDLᵀ (in place on copies). */
function solveBanded3(A: Float64Array, b: Float64Array, n: number): Float64Array {
  const L = new Float64Array(n * 4); // L[i*4 + d] = L(i, i − d), d = 1..3
  const D = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    for (let j = Math.max(0, i - 3); j < i; j++) {
      let sum = A[j * 4 + (i - j)];
      for (let q = Math.max(0, i - 3); q < j; q++) sum -= L[i * 4 + (i - q)] * L[j * 4 + (j - q)] * D[q];
      L[i * 4 + (i - j)] = sum / D[j];
    }
    let d = A[i * 4];
    for (let q = Math.max(0, i - 3); q < i; q++) d -= L[i * 4 + (i - q)] ** 2 * D[q];
    D[i] = d > 1e-300 ? d : 1e-300;
  }
  const x = Float64Array.from(b);
  for (let i = 0; i < n; i++) for (let q = Math.max(0, i - 3); q < i; q++) x[i] -= L[i * 4 + (i - q)] * x[q];
  for (let i = 0; i < n; i++) x[i] /= D[i];
  for (let i = n - 1; i >= 0; i--) for (let q = i + 1; q <= Math.min(n - 1, i + 3); q++) x[i] -= L[q * 4 + (q - i)] * x[q];
  return x;
}

/** Errors of a fit at the samples and between them (see the file header). */
function measure(t: Float64Array, y: Float64Array, ms: Float64Array, knots: Float64Array, p: Float64Array): FitError {
  const K = knots.length;
  const seg = new Float64Array(K - 1);
  let atSamples = 0;
  let between = 0;
  let k = 0;
  const at = (x: number) => {
    while (k < K - 2 && x >= knots[k + 1]) k++;
    const h = knots[k + 1] - knots[k];
    return hermiteAt(p[2 * k], p[2 * k + 1], p[2 * k + 2], p[2 * k + 3], h, (x - knots[k]) / h);
  };
  for (let i = 0; i < t.length; i++) {
    const e = Math.abs(at(t[i]) - y[i]);
    if (e > seg[k]) seg[k] = e;
    if (e > atSamples) atSamples = e;
    if (i + 1 < t.length) {
      const g = t[i + 1] - t[i];
      for (let q = 1; q <= 3; q++) {
        const s = 0.25 * q;
        const ref = hermiteAt(y[i], ms[i], y[i + 1], ms[i + 1], g, s);
        const e2 = Math.abs(at(t[i] + s * g) - ref);
        if (e2 > seg[k]) seg[k] = e2;
        if (e2 > between) between = e2;
      }
    }
  }
  return { seg, atSamples, between };
}

interface Trial { knots: Float64Array; p: Float64Array; err: FitError; max: number }

function trial(t: Float64Array, y: Float64Array, ms: Float64Array, knots: Float64Array, opts: FitOptions): Trial {
  const p = leastSquaresHermite(t, y, knots, opts);
  const err = measure(t, y, ms, knots, p);
  return { knots, p, err, max: Math.max(err.atSamples, err.between) };
}

/** Index of the sample nearest the middle of (a, b), strictly inside, or −1. */
function splitIndex(t: Float64Array, a: number, b: number): number {
  const mid = 0.5 * (a + b);
  let lo = 0;
  let hi = t.length - 1;
  while (hi - lo > 1) {
    const m = (lo + hi) >> 1;
    if (t[m] <= mid) lo = m;
    else hi = m;
  }
  const cands = [lo, hi].filter((i) => t[i] > a && t[i] < b);
  if (cands.length === 0) return -1;
  return cands.reduce((best, i) => (Math.abs(t[i] - mid) < Math.abs(t[best] - mid) ? i : best));
}

/** Greedy subdivision then knot removal (file header, steps 1–2). */
function adaptive(t: Float64Array, y: Float64Array, ms: Float64Array, tol: number, opts: FitOptions, maxKeys: number): Trial {
  let knots = Float64Array.of(t[0], t[t.length - 1]);
  let cur = trial(t, y, ms, knots, opts);
  while (cur.max > tol && knots.length < maxKeys) {
    const next: number[] = [knots[0]];
    let added = 0;
    for (let k = 0; k + 1 < knots.length; k++) {
      if (cur.err.seg[k] > tol && knots.length + added < maxKeys) {
        const i = splitIndex(t, knots[k], knots[k + 1]);
        if (i >= 0) { next.push(t[i]); added++; }
      }
      next.push(knots[k + 1]);
    }
    if (added === 0) break;
    knots = Float64Array.from(next);
    cur = trial(t, y, ms, knots, opts);
  }
  if (cur.max > tol) return cur;
  return removeKnots(t, y, ms, tol, opts, cur);
}

/** First index i with t[i] ≥ x (binary search). */
function lowerBound(t: Float64Array, x: number): number {
  let lo = 0;
  let hi = t.length;
  while (lo < hi) {
    const m = (lo + hi) >> 1;
    if (t[m] < x) lo = m + 1;
    else hi = m;
  }
  return lo;
}

/**
 * Drop interior knots while the curve still meets the tolerance. Removing knot j is tried by a local
 * refit: the knots j−2 … j+2 without j, with the values and slopes of the two outer ones held, fitted
 * to the samples between them (so the rest of the curve is unchanged and a trial costs only the
 * window's samples). Sweeps go in order of least local error, at most 3, each trying every knot once.
 * At the end the whole curve is refitted by least squares and kept if it also meets the tolerance.
 */
function removeKnots(t: Float64Array, y: Float64Array, ms: Float64Array, tol: number, opts: FitOptions, start: Trial): Trial {
  const knots = Array.from(start.knots);
  const p = Array.from(start.p);
  let seg = Array.from(start.err.seg);
  for (let sweep = 0; sweep < 3 && knots.length > 2; sweep++) {
    const order: number[] = [];
    for (let j = 1; j < knots.length - 1; j++) order.push(j);
    const local = (j: number) => Math.max(seg[j - 1], seg[j]);
    order.sort((a, b) => local(a) - local(b));
    const candidates = order.map((j) => knots[j]);
    let removed = 0;
    for (const time of candidates) {
      const j = knots.indexOf(time);
      if (j <= 0 || j >= knots.length - 1) continue;
      const L = Math.max(0, j - 2);
      const R = Math.min(knots.length - 1, j + 2);
      const wk = Float64Array.from(knots.slice(L, R + 1).filter((_, m) => L + m !== j));
      const i0 = lowerBound(t, knots[L]);
      const i1 = lowerBound(t, knots[R]) + 1; // include the sample at knots[R]
      const tw = t.subarray(i0, Math.min(t.length, i1));
      const yw = y.subarray(i0, Math.min(t.length, i1));
      const mw = ms.subarray(i0, Math.min(t.length, i1));
      const last = 2 * (wk.length - 1);
      const fixed: [number, number][] = [[0, p[2 * L]], [1, p[2 * L + 1]], [last, p[2 * R]], [last + 1, p[2 * R + 1]]];
      if (tw.length < 2) continue;
      const pw = leastSquaresHermite(tw, yw, wk, {}, fixed);
      const ew = measure(tw, yw, mw, wk, pw);
      if (Math.max(ew.atSamples, ew.between) > tol) continue;
      // accept: splice the window's knots, parameters and segment errors
      knots.splice(L, R - L + 1, ...wk);
      p.splice(2 * L, 2 * (R - L + 1), ...pw);
      seg.splice(L, R - L, ...ew.seg);
      removed++;
    }
    if (removed === 0) break;
  }
  const kf = Float64Array.from(knots);
  const global = trial(t, y, ms, kf, opts);
  if (global.max <= tol) return global;
  const pf = Float64Array.from(p);
  const err = measure(t, y, ms, kf, pf);
  seg = Array.from(err.seg);
  return { knots: kf, p: pf, err, max: Math.max(err.atSamples, err.between) };
}

function uniformKnots(a: number, b: number, count: number): Float64Array {
  const k = new Float64Array(count);
  for (let i = 0; i < count; i++) k[i] = i === count - 1 ? b : a + ((b - a) * i) / (count - 1);
  return k;
}

/** Smallest uniform knot count that meets the tolerance (doubling, then bisection), or null. */
function uniform(t: Float64Array, y: Float64Array, ms: Float64Array, tol: number, opts: FitOptions, maxKeys: number): Trial | null {
  const a = t[0];
  const b = t[t.length - 1];
  let lo = 1; // fails (fewer than 2 knots is impossible)
  let hi = 2;
  let best: Trial | null = null;
  for (;;) {
    const tr = trial(t, y, ms, uniformKnots(a, b, hi), opts);
    if (tr.max <= tol) { best = tr; break; }
    lo = hi;
    if (hi >= maxKeys) return null;
    hi = Math.min(maxKeys, hi * 2);
  }
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    const tr = trial(t, y, ms, uniformKnots(a, b, mid), opts);
    if (tr.max <= tol) { hi = mid; best = tr; } else lo = mid;
  }
  return best;
}

/**
 * Fit a hermite curve with as few keys as the search finds to the samples within `tolerance`
 * (absolute, in value units). Samples: strictly increasing times, at least 2.
 */
export function fitSamples(times: Float64Array, values: Float64Array, tolerance: number, opts: FitOptions = {}): FitResult {
  if (!(tolerance > 0) || !Number.isFinite(tolerance)) throw new Error(`tolerance: must be a positive finite number, got ${tolerance}`);
  if (times.length !== values.length) throw new Error(`samples: ${times.length} times but ${values.length} values`);
  if (times.length < 2) throw new Error(`samples: need at least 2, got ${times.length}`);
  for (let i = 1; i < times.length; i++) {
    if (!(times[i] > times[i - 1])) throw new Error(`samples[${i}].time: must be greater than samples[${i - 1}].time (strictly increasing)`);
  }
  const maxKeys = Math.max(2, Math.min(opts.maxKeys ?? times.length, times.length));
  const ms = sampleSlopes(times, values);
  const ad = adaptive(times, values, ms, tolerance, opts, maxKeys);
  const un = uniform(times, values, ms, tolerance, opts, Math.min(maxKeys, ad.max <= tolerance ? ad.knots.length : maxKeys));
  let pick = ad;
  let method: FitResult['method'] = 'adaptive';
  if (un && (ad.max > tolerance || un.knots.length < ad.knots.length)) {
    pick = removeKnots(times, values, ms, tolerance, opts, un);
    method = 'uniform';
  }
  const keys: FitKey[] = [];
  for (let k = 0; k < pick.knots.length; k++) keys.push({ time: pick.knots[k], value: pick.p[2 * k], slope: pick.p[2 * k + 1] });
  return {
    keys,
    ok: pick.max <= tolerance,
    tolerance,
    maxError: pick.max,
    maxErrorAtSamples: pick.err.atSamples,
    maxErrorBetween: pick.err.between,
    uniformKeys: un ? un.knots.length : 0,
    method,
  };
}
