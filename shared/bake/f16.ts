/**
 * IEEE 754-2008 binary16 ("half"): 1 sign bit, 5 exponent bits (bias 15), 10 fraction bits.
 * Max finite 65504, smallest normal 2⁻¹⁴, smallest subnormal 2⁻²⁴, unit round-off 2⁻¹¹.
 *
 * `roundF16(x)` rounds a double to the nearest binary16 value, ties to even (IEEE 754 §4.3.1
 * roundTiesToEven), and returns it as a double. Values that round beyond 65504 become ±Infinity,
 * as the standard's overflow rule says. `f16Bits` / `f16FromBits` convert to and from the 16-bit code.
 *
 * Method: for |x| in the normal range the spacing of binary16 numbers is 2^(e−10) with
 * e = floor(log2 |x|); below 2⁻¹⁴ it is fixed at 2⁻²⁴. Dividing by the spacing (a power of two, so
 * exact) and rounding half to even gives the code exactly in double arithmetic.
 */

const MAX_F16 = 65504;

/** Round half to even for a double whose fractional part is exactly representable (always true after a power-of-two scale). */
function roundHalfEven(x: number): number {
  const f = Math.floor(x);
  const d = x - f;
  if (d > 0.5) return f + 1;
  if (d < 0.5) return f;
  return f % 2 === 0 ? f : f + 1;
}

/** The binary16 value nearest to x (ties to even), as a double. NaN stays NaN. */
export function roundF16(x: number): number {
  if (Number.isNaN(x) || x === 0 || !Number.isFinite(x)) return x;
  const a = Math.abs(x);
  let e = Math.floor(Math.log2(a));
  // log2 can be off by one near powers of two; fix it exactly.
  if (2 ** e > a) e -= 1;
  else if (2 ** (e + 1) <= a) e += 1;
  if (e < -14) e = -14; // subnormal range: fixed spacing 2^-24
  const ulp = 2 ** (e - 10);
  const r = roundHalfEven(a / ulp) * ulp;
  if (r > MAX_F16) return x > 0 ? Infinity : -Infinity;
  return x < 0 ? -r : r;
}

/** The 16-bit code of roundF16(x). */
export function f16Bits(x: number): number {
  const r = roundF16(x);
  if (Number.isNaN(r)) return 0x7e00;
  const sign = r < 0 || Object.is(r, -0) ? 0x8000 : 0;
  const a = Math.abs(r);
  if (a === Infinity) return sign | 0x7c00;
  if (a === 0) return sign;
  if (a < 2 ** -14) return sign | Math.round(a / 2 ** -24); // subnormal: exact
  let e = Math.floor(Math.log2(a));
  if (2 ** e > a) e -= 1;
  else if (2 ** (e + 1) <= a) e += 1;
  const frac = Math.round((a / 2 ** e - 1) * 1024); // exact: a is a binary16 value
  return sign | ((e + 15) << 10) | frac;
}

/** Decode a 16-bit binary16 code to a double (exact). */
export function f16FromBits(bits: number): number {
  const sign = bits & 0x8000 ? -1 : 1;
  const exp = (bits >> 10) & 0x1f;
  const frac = bits & 0x3ff;
  if (exp === 0) return sign * frac * 2 ** -24;
  if (exp === 0x1f) return frac ? NaN : sign * Infinity;
  return sign * (1 + frac / 1024) * 2 ** (exp - 15);
}

export const F16_MAX = MAX_F16;
