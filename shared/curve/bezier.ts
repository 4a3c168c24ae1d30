/**
 * Cubic Bézier segments with CSS cubic-bezier() semantics (W3C CSS Easing Functions Level 1 §2.2):
 * time is a cubic x(s) of the curve parameter s ∈ [0, 1] and value is a cubic y(s); to evaluate at
 * time t solve x(s) = t, then take y(s). With handle times inside the segment x is non-decreasing,
 * so the root is unique (where x' > 0).
 *
 * Power basis of a Bernstein cubic P(s) = (1−s)³p0 + 3(1−s)²s p1 + 3(1−s)s² p2 + s³ p3:
 *   P(s) = p0 + s(c + s(b + s·a)),  c = 3(p1 − p0),  b = 3(p2 − 2p1 + p0),  a = p3 − p0 − c − b.
 * Derivatives with respect to time by the chain rule (x', y' … are d/ds):
 *   dy/dt   = y'/x'
 *   d²y/dt² = N/x'³,               N  = y''x' − y'x''
 *   d³y/dt³ = M/x'⁵,               M  = N'x' − 3N x'',   N' = y'''x' − y'x'''
 *   d⁴y/dt⁴ = (M'x' − 5M x'')/x'⁷,  M' = N''x' − 2N'x'' − 3N x''',  N'' = y'''x'' − y''x'''
 */

/** Iteration cap of bezierSolve: bisection alone reaches double resolution on [0, 1] in 53 steps. */
export const BEZIER_MAX_ITERATIONS = 100;
/** bezierSolve stops when a Newton step or the bracket is below this (in s). */
export const BEZIER_TOLERANCE = 2 ** -53;

/**
 * The parameter s ∈ [0, 1] with x(s) = t for the Bernstein cubic x0..x3 (x0 ≤ x1, x2 ≤ x3 assumed,
 * so x is non-decreasing). Safeguarded Newton: a bracket [lo, hi] with x(lo) ≤ t ≤ x(hi) is kept;
 * the Newton step s − (x(s) − t)/x'(s) is taken when it stays strictly inside the bracket, else the
 * bracket is bisected (so it converges even where x' = 0, i.e. near-vertical handles). Stops when
 * x(s) = t exactly, a step or the bracket is ≤ BEZIER_TOLERANCE, or after BEZIER_MAX_ITERATIONS.
 * t ≤ x0 gives 0 and t ≥ x3 gives 1.
 * Accuracy: |x(s) − t| within a few ulps; a value error ≤ 1e-12·|Δy| where x' > 0, including handles
 * nearly vertical at the segment ends (x1 = 1e-9: tested to 1.5e-15). At an interior point where x'
 * vanishes (e.g. x1 = 1, x2 = 0) the problem itself is ill-conditioned in double precision: s is only
 * determined to about ∛ε ≈ 6e-6 there; curveBreaks lists that point and the derivative bound is Infinity.
 */
export function bezierSolve(x0: number, x1: number, x2: number, x3: number, t: number): number {
  if (!(t > x0)) return 0;
  if (!(t < x3)) return 1;
  const c = 3 * (x1 - x0);
  const b = 3 * (x2 - 2 * x1 + x0);
  const a = x3 - x0 - c - b;
  let lo = 0;
  let hi = 1;
  let s = (t - x0) / (x3 - x0);
  for (let iter = 0; iter < BEZIER_MAX_ITERATIONS; iter++) {
    const f = x0 + s * (c + s * (b + s * a)) - t;
    if (f === 0) return s;
    if (f < 0) lo = s;
    else hi = s;
    const d = c + s * (2 * b + 3 * a * s);
    let next = d > 0 ? s - f / d : NaN;
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    if (Math.abs(next - s) <= BEZIER_TOLERANCE || hi - lo <= BEZIER_TOLERANCE) return next;
    s = next;
  }
  return s;
}

/**
 * bezierSolve(0, x1, x2, 1, X) with a memo (a pure function of x1, x2 and X, so a hit returns the very
 * same double): direct-mapped, SOLVE_SLOTS slots chosen from X. The baker asks for the same times
 * again and again: a table entry's value and slope, the derivative bound of the interval on each side,
 * the error samples at the interval's ends.
 */
const SOLVE_SLOTS = 4096;
const SOLVE_KEYS = new Float64Array(3 * SOLVE_SLOTS).fill(Number.NaN);
const SOLVE_VALUES = new Float64Array(SOLVE_SLOTS);
export function bezierSolveUnit(x1: number, x2: number, X: number): number {
  const j = ((X * 2654435.769) | 0) & (SOLVE_SLOTS - 1);
  const o = 3 * j;
  if (SOLVE_KEYS[o] === X && SOLVE_KEYS[o + 1] === x1 && SOLVE_KEYS[o + 2] === x2) return SOLVE_VALUES[j];
  const s = bezierSolve(0, x1, x2, 1, X);
  SOLVE_KEYS[o] = X; SOLVE_KEYS[o + 1] = x1; SOLVE_KEYS[o + 2] = x2;
  SOLVE_VALUES[j] = s;
  return s;
}

/** The Bernstein cubic p0..p3 or its derivative d^k/ds^k (k = 0..3; 0 for k ≥ 4) at s. */
export function bernstein(p0: number, p1: number, p2: number, p3: number, s: number, k: number): number {
  const c = 3 * (p1 - p0);
  const b = 3 * (p2 - 2 * p1 + p0);
  const a = p3 - p0 - c - b;
  switch (k) {
    case 0: return p0 + s * (c + s * (b + s * a));
    case 1: return c + s * (2 * b + 3 * a * s);
    case 2: return 2 * b + 6 * a * s;
    case 3: return 6 * a;
    default: return 0;
  }
}

/**
 * Value (order 0) or d^k y/dX^k (order 1..4) of a normalised Bézier segment: time X ∈ [0, 1] with
 * x-controls 0, x1, x2, 1 and value controls y0..y3. Derivatives are with respect to X; divide by
 * the segment duration^k for seconds. Where x'(s) = 0 a derivative is ±Infinity (vertical tangent).
 */
export function bezierEase(
  x1: number, x2: number, y0: number, y1: number, y2: number, y3: number, X: number, order: number,
): number {
  const s = bezierSolveUnit(x1, x2, X);
  if (order === 0) return bernstein(y0, y1, y2, y3, s, 0);
  const xd1 = bernstein(0, x1, x2, 1, s, 1);
  const yd1 = bernstein(y0, y1, y2, y3, s, 1);
  if (order === 1) return yd1 / xd1;
  const xd2 = bernstein(0, x1, x2, 1, s, 2);
  const yd2 = bernstein(y0, y1, y2, y3, s, 2);
  const N = yd2 * xd1 - yd1 * xd2;
  if (order === 2) return N / (xd1 * xd1 * xd1);
  const xd3 = bernstein(0, x1, x2, 1, s, 3);
  const yd3 = bernstein(y0, y1, y2, y3, s, 3);
  const N1 = yd3 * xd1 - yd1 * xd3;
  const M = N1 * xd1 - 3 * N * xd2;
  const x2p = xd1 * xd1;
  if (order === 3) return M / (x2p * x2p * xd1);
  const N2 = yd3 * xd2 - yd2 * xd3;
  const M1 = N2 * xd1 - 2 * N1 * xd2 - 3 * N * xd3;
  return (M1 * xd1 - 5 * M * xd2) / (x2p * x2p * x2p * xd1);
}

/** max |c + 2b·s + 3a·s²| over s ∈ [sa, sb] (the derivative of a power-basis cubic: ends and vertex). */
function maxAbsSpeed(c: number, b: number, a: number, sa: number, sb: number): number {
  let m = Math.max(Math.abs(c + sa * (2 * b + 3 * a * sa)), Math.abs(c + sb * (2 * b + 3 * a * sb)));
  if (a !== 0) {
    const v = -b / (3 * a);
    if (v > sa && v < sb) m = Math.max(m, Math.abs(c + v * (2 * b + 3 * a * v)));
  }
  return m;
}

/**
 * A rigorous upper bound of |d^k y/dX^k| over X ∈ [Xa, Xb] for the normalised Bézier segment,
 * by interval reasoning on the chain-rule formulas above: the parameter range [sa, sb] is solved
 * and widened by 1e-12, each |y^(j)|, |x^(j)| is replaced by its exact max there and x' by its exact
 * min, then the triangle inequality. Infinity when x' reaches 0 on the range (vertical tangent).
 */
export function bezierEaseBound(
  x1: number, x2: number, y0: number, y1: number, y2: number, y3: number, order: number, Xa: number, Xb: number,
): number {
  const sa = Math.max(0, bezierSolveUnit(x1, x2, Math.min(Xa, Xb)) - 1e-12);
  const sb = Math.min(1, bezierSolveUnit(x1, x2, Math.max(Xa, Xb)) + 1e-12);
  // the power-basis coefficients bernstein() computes for x (controls 0, x1, x2, 1) and y, once: every
  // figure below is the same number minXSpeed and maxAbsDerivative give (tests/unit/curve/bezier.test.ts)
  const xc = 3 * (x1 - 0), xb = 3 * (x2 - 2 * x1 + 0), xa = 1 - 0 - xc - xb;
  const yc = 3 * (y1 - y0), yb = 3 * (y2 - 2 * y1 + y0), ya = y3 - y0 - yc - yb;
  // min of the speed x'(s) over [sa, sb] (minXSpeed): ends and vertex
  let xmin = Math.min(xc + sa * (2 * xb + 3 * xa * sa), xc + sb * (2 * xb + 3 * xa * sb));
  {
    const bb = 3 * (x2 - 2 * x1), aa = 1 - 3 * x1 - bb;
    if (aa !== 0) {
      const v = -bb / (3 * aa);
      if (v > sa && v < sb) xmin = Math.min(xmin, xc + v * (2 * xb + 3 * xa * v));
    }
  }
  if (!(xmin > 0)) return Infinity;
  // the largest first (a quadratic: ends and vertex), second (linear: ends) and third (constant)
  // derivative sizes, as maxAbsDerivative
  const X1 = maxAbsSpeed(xc, xb, xa, sa, sb), Y1 = maxAbsSpeed(yc, yb, ya, sa, sb);
  const X2 = Math.max(Math.abs(2 * xb + 6 * xa * sa), Math.abs(2 * xb + 6 * xa * sb));
  const Y2 = Math.max(Math.abs(2 * yb + 6 * ya * sa), Math.abs(2 * yb + 6 * ya * sb));
  const X3 = Math.abs(6 * xa), Y3 = Math.abs(6 * ya);
  const N = Y2 * X1 + Y1 * X2;
  const N1 = Y3 * X1 + Y1 * X3;
  const N2 = Y3 * X2 + Y2 * X3;
  const M = N1 * X1 + 3 * N * X2;
  const M1 = N2 * X1 + 2 * N1 * X2 + 3 * N * X3;
  let r: number;
  switch (order) {
    case 1: r = Y1 / xmin; break;
    case 2: r = N / xmin ** 3; break;
    case 3: r = M / xmin ** 5; break;
    default: r = (M1 * X1 + 5 * M * X2) / xmin ** 7;
  }
  return r * (1 + 1e-12);
}

/**
 * The slope dy/dX where the segment leaves its start, as CSS Easing extends a cubic-bezier for
 * input < 0: along P0→P1 if x1 > 0, else along P0→P2 if x2 > 0, else 0.
 */
export function bezierStartSlope(x1: number, x2: number, y0: number, y1: number, y2: number): number {
  if (x1 > 0) return (y1 - y0) / x1;
  if (x2 > 0) return (y2 - y0) / x2;
  return 0;
}

/** The slope dy/dX at the segment end, as CSS Easing extends input > 1: P2→P3 if x2 < 1, else P1→P3 if x1 < 1, else 0. */
export function bezierEndSlope(x1: number, x2: number, y1: number, y2: number, y3: number): number {
  if (x2 < 1) return (y3 - y2) / (1 - x2);
  if (x1 < 1) return (y3 - y1) / (1 - x1);
  return 0;
}
