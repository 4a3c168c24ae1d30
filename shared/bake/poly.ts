/**
 * Cubic polynomial helpers for the exact error. A cubic is stored as [c0, c1, c2, c3] meaning
 * p(u) = c0 + c1·u + c2·u² + c3·u³ in a local variable u = t − origin.
 */

/**
 * Cubic Hermite piece on [0, H] in power form (Burden & Faires §3.4, from memory):
 * with Δ = v1 − v0, p(u) = v0 + m0·u + (3Δ/H − 2m0 − m1)·u²/H + (m0 + m1 − 2Δ/H)·u³/H².
 * Writes into out (length ≥ 4) and returns it.
 */
export function hermiteCoeffs(v0: number, m0: number, v1: number, m1: number, H: number, out: Float64Array): Float64Array {
  const d = (v1 - v0) / H;
  out[0] = v0;
  out[1] = m0;
  out[2] = (3 * d - 2 * m0 - m1) / H;
  out[3] = (m0 + m1 - 2 * d) / (H * H);
  return out;
}

/** Linear piece v0 → v1 on [0, H] in power form: p(u) = v0 + (v1 − v0)/H · u. */
export function linearCoeffs(v0: number, v1: number, H: number, out: Float64Array): Float64Array {
  out[0] = v0;
  out[1] = (v1 - v0) / H;
  out[2] = 0;
  out[3] = 0;
  return out;
}

/**
 * Taylor shift: the coefficients of q(w) = p(w + s), i.e. re-expand about a new origin s.
 * q0 = p(s), q1 = p'(s), q2 = p''(s)/2, q3 = p'''(s)/6 = c3. In place on `c`.
 */
export function shiftCubic(c: Float64Array, s: number): Float64Array {
  if (s === 0) return c;
  const c0 = c[0], c1 = c[1], c2 = c[2], c3 = c[3];
  c[0] = c0 + s * (c1 + s * (c2 + s * c3));
  c[1] = c1 + s * (2 * c2 + 3 * s * c3);
  c[2] = c2 + 3 * s * c3;
  c[3] = c3;
  return c;
}

/** p(u) by Horner's rule, for the cubic whose coefficients start at c[o]. */
export function cubicAt(c: Float64Array, u: number, o = 0): number {
  return c[o] + u * (c[o + 1] + u * (c[o + 2] + u * c[o + 3]));
}

/** p′(u) = c1 + u·(2c2 + 3u·c3), for the cubic whose coefficients start at c[o]. */
export function cubicSlopeAt(c: Float64Array, u: number, o = 0): number {
  return c[o + 1] + u * (2 * c[o + 2] + 3 * u * c[o + 3]);
}

/** Result slot for maxAbsCubic: [max |p|, argument u]. Reused to avoid allocation. */
export const MAX_SLOT = new Float64Array(2);

/**
 * max over u ∈ [0, L] of |p(u)| for a cubic p, exactly (up to double rounding): a continuous
 * function's extreme on a closed interval is at an end or at a critical point, and the critical
 * points of a cubic are the roots of p'(u) = c1 + 2c2·u + 3c3·u². The quadratic is solved with the
 * cancellation-free form q = −(b + sign(b)·√(b² − 4ac))/2, roots q/a and c/q (Press et al.,
 * Numerical Recipes §5.6, from memory). Writes [max, argmax] to MAX_SLOT and returns the max;
 * +Infinity when a coefficient is not finite (NaN counts as failure).
 */
export function maxAbsCubic(c: Float64Array, L: number): number {
  // a non-finite coefficient (a table slope of ±Infinity, NaN) makes the error unknown: +Infinity, never NaN
  if (!Number.isFinite(c[0] + c[1] + c[2] + c[3])) { MAX_SLOT[0] = Infinity; MAX_SLOT[1] = 0; return Infinity; }
  let best = Math.abs(c[0]);
  let at = 0;
  const end = Math.abs(cubicAt(c, L));
  if (end > best) { best = end; at = L; }
  const a = 3 * c[3], b = 2 * c[2], cc = c[1];
  if (a !== 0) {
    const disc = b * b - 4 * a * cc;
    if (disc >= 0) {
      const sq = Math.sqrt(disc);
      const q = -0.5 * (b + (b >= 0 ? sq : -sq));
      if (q !== 0) {
        const r1 = q / a, r2 = cc / q;
        if (r1 > 0 && r1 < L) { const v = Math.abs(cubicAt(c, r1)); if (v > best) { best = v; at = r1; } }
        if (r2 > 0 && r2 < L) { const v = Math.abs(cubicAt(c, r2)); if (v > best) { best = v; at = r2; } }
      } else {
        // b = 0 and disc = 0 → c1 = 0: double root at u = 0 (already an end).
      }
    }
  } else if (b !== 0) {
    const r = -cc / b;
    if (r > 0 && r < L) { const v = Math.abs(cubicAt(c, r)); if (v > best) { best = v; at = r; } }
  }
  MAX_SLOT[0] = best;
  MAX_SLOT[1] = at;
  return best;
}
