/**
 * Exact maxima of |p| over an interval for the low-degree polynomials and the
 * trigonometric factors used by the derivative bounds.
 *
 * A continuous function on [a, b] takes its extreme values at the end points or
 * at interior critical points (Weierstrass / Fermat); for a cubic the critical
 * points are the real roots of its quadratic derivative, found with the
 * cancellation-free quadratic formula (Press et al., Numerical Recipes §5.6).
 * Results are inflated by SAFETY (a relative 1e-12) so rounding never makes a
 * bound fall below a sampled value.
 */

/** Relative inflation applied to every bound so floating-point rounding cannot under-estimate. */
export const SAFETY = 1 + 1e-12;

function cubicAt(c0: number, c1: number, c2: number, c3: number, u: number): number {
  return c0 + u * (c1 + u * (c2 + u * c3));
}

/**
 * max |c0 + c1·u + c2·u² + c3·u³| over u ∈ [a, b] (a ≤ b), exact up to rounding:
 * end points plus the roots of 3c3·u² + 2c2·u + c1 inside (a, b).
 */
export function maxAbsCubic(c0: number, c1: number, c2: number, c3: number, a: number, b: number): number {
  let m = Math.max(Math.abs(cubicAt(c0, c1, c2, c3, a)), Math.abs(cubicAt(c0, c1, c2, c3, b)));
  const A = 3 * c3;
  const B = 2 * c2;
  const C = c1;
  if (A === 0) {
    if (B !== 0) {
      const u = -C / B;
      if (u > a && u < b) m = Math.max(m, Math.abs(cubicAt(c0, c1, c2, c3, u)));
    }
    return m;
  }
  const disc = B * B - 4 * A * C;
  if (disc < 0) return m;
  const q = -0.5 * (B + (B >= 0 ? 1 : -1) * Math.sqrt(disc));
  const r1 = q / A;
  if (r1 > a && r1 < b) m = Math.max(m, Math.abs(cubicAt(c0, c1, c2, c3, r1)));
  if (q !== 0) {
    const r2 = C / q;
    if (r2 > a && r2 < b) m = Math.max(m, Math.abs(cubicAt(c0, c1, c2, c3, r2)));
  }
  return m;
}

/**
 * max |sin x| over x ∈ [a, b]: 1 if a peak π/2 + kπ lies in the interval, else
 * the larger end value (|sin| is monotone between consecutive peaks and zeros).
 */
export function maxAbsSin(a: number, b: number): number {
  if (b - a >= Math.PI) return 1;
  const k = Math.ceil((a - Math.PI / 2) / Math.PI);
  const peak = Math.PI / 2 + k * Math.PI;
  if (peak <= b) return 1;
  return Math.max(Math.abs(Math.sin(a)), Math.abs(Math.sin(b)));
}

/** Binomial coefficients C(n, j) for n ≤ 4, used by Leibniz' product rule. */
export const BINOMIAL: readonly (readonly number[])[] = [[1], [1, 1], [1, 2, 1], [1, 3, 3, 1], [1, 4, 6, 4, 1]];

/** n! / (n − k)! for small integers (falling factorial), 0 when k > n. */
export function falling(n: number, k: number): number {
  if (k > n) return 0;
  let r = 1;
  for (let j = 0; j < k; j++) r *= n - j;
  return r;
}
