/**
 * Number formats of a table's values and slopes, and their round-off.
 * - f32: IEEE 754 binary32, round to nearest even (Math.fround).
 * - f16: IEEE 754 binary16, round to nearest even (./f16.ts); |x| must round below 65504.
 * - unorm16 / unorm8: per-array offset and scale (both stored as f32); code c = round((x − offset)/scale·(2ⁿ−1))
 *   clamped to [0, 2ⁿ−1]; decoded offset + scale·c/(2ⁿ−1) (glTF 2.0 normalized integers; OpenGL ES 3.0
 *   §2.1.6.1). Round-off at most scale/(2(2ⁿ−1)) for x inside [offset, offset + scale].
 */
import type { Encoding } from './profile';
import { f16Bits, f16FromBits, roundF16 } from './f16';

export type Codes = Float32Array | Uint16Array | Uint8Array;

export interface Encoded {
  codes: Codes;
  decoded: Float64Array;
  offset: number;
  scale: number;
}

export const ENCODING_BYTES: Record<Encoding, number> = { f32: 4, f16: 2, unorm16: 2, unorm8: 1 };
export const ENCODING_CODE: Record<Encoding, number> = { f32: 0, f16: 1, unorm16: 2, unorm8: 3 };

/** Largest code of an n-bit unorm: 2ⁿ − 1. */
export function unormMax(e: Encoding): number {
  return e === 'unorm16' ? 65535 : e === 'unorm8' ? 255 : 0;
}

/** A quantizer: offset/scale fixed from [min, max] (unorm), identity for floats. */
export interface Quantizer {
  encoding: Encoding;
  offset: number;
  scale: number;
}

export function makeQuantizer(encoding: Encoding, min: number, max: number): Quantizer {
  if (encoding === 'unorm16' || encoding === 'unorm8') {
    const offset = Math.fround(min);
    let scale = Math.fround(max - offset);
    if (!(scale > 0)) scale = 0;
    // make sure offset + scale reaches max despite the f32 rounding of scale; step to the next float32
    // (a relative step would stall on subnormal scales and loop for ever)
    while (scale > 0 && offset + scale < max) scale = nextUpF32(scale);
    return { encoding, offset, scale };
  }
  return { encoding, offset: 0, scale: 1 };
}

/**
 * Math.round(y) (ECMA-262 §21.3.2.28), the same number, as ⌊y + 0.5⌋ for 0.5 ≤ y < 2⁵²: 0.5 is a whole
 * number of y's ulps there, so the sum is exact unless it enters the next binade, and rounding it then
 * cannot reach a whole number it did not already pass (that would need an ulp of ½ or more). Math.round
 * itself compiles to a branch on the fraction, which the entries of a new trial table mispredict about
 * every other time (about 3× the cost of a decode loop); this one branches only outside that range (the
 * few codes at the bottom of a unorm range).
 */
export function roundHalfUp(y: number): number {
  return y >= 0.5 && y < 4503599627370496 ? Math.floor(y + 0.5) : Math.round(y);
}

/** The unorm code of x for offset, scale and M = 2ⁿ − 1: round((x − offset)/scale·M) clamped to [0, M] (0 when scale is 0). */
export function unormCode(x: number, offset: number, scale: number, M: number): number {
  if (scale === 0) return 0;
  const c = roundHalfUp(((x - offset) / scale) * M);
  return c < 0 ? 0 : c > M ? M : c;
}

/** Encode x to its code (as a number). Throws on f16 overflow. */
export function encodeOne(q: Quantizer, x: number): number {
  switch (q.encoding) {
    case 'f32': return Math.fround(x);
    case 'f16': {
      const r = roundF16(x);
      if (!Number.isFinite(r)) throw new RangeError(`value ${x} is outside the f16 range (±65504)`);
      return f16Bits(x);
    }
    default: return unormCode(x, q.offset, q.scale, unormMax(q.encoding));
  }
}

/** Decode a code as the runtime does (exact in double; the runtime's float arithmetic adds ≤ 1 ulp). */
export function decodeOne(q: Quantizer, code: number): number {
  switch (q.encoding) {
    case 'f32': return code;
    case 'f16': return f16FromBits(code);
    default: return q.offset + q.scale * (code / unormMax(q.encoding));
  }
}

/** Round x through the encoding (encode then decode). */
export function roundTrip(q: Quantizer, x: number): number {
  return decodeOne(q, encodeOne(q, x));
}

/** Encode a whole array (encodeOne and decodeOne per number; the unorm and f32 loops written out, the same arithmetic). */
export function encodeArray(q: Quantizer, xs: Float64Array): Encoded {
  const n = xs.length;
  const codes: Codes =
    q.encoding === 'f32' ? new Float32Array(n) : q.encoding === 'unorm8' ? new Uint8Array(n) : new Uint16Array(n);
  const decoded = new Float64Array(n);
  if (q.encoding === 'unorm8' || q.encoding === 'unorm16') {
    const M = unormMax(q.encoding), off = q.offset, sc = q.scale;
    for (let i = 0; i < n; i++) {
      const c = unormCode(xs[i], off, sc, M);
      codes[i] = c;
      decoded[i] = off + sc * (c / M);
    }
    return { codes, decoded, offset: off, scale: sc };
  }
  if (q.encoding === 'f32') {
    for (let i = 0; i < n; i++) { const c = Math.fround(xs[i]); codes[i] = c; decoded[i] = c; }
    return { codes, decoded, offset: q.offset, scale: q.scale };
  }
  for (let i = 0; i < n; i++) {
    const c = encodeOne(q, xs[i]);
    codes[i] = c;
    decoded[i] = decodeOne(q, c);
  }
  return { codes, decoded, offset: q.offset, scale: q.scale };
}

/** Min and max of an array. */
export function minMax(xs: Float64Array): [number, number] {
  let lo = Infinity, hi = -Infinity;
  for (let i = 0; i < xs.length; i++) { const x = xs[i]; if (x < lo) lo = x; if (x > hi) hi = x; }
  return [lo, hi];
}

const F32 = new Float32Array(1);
const U32 = new Uint32Array(F32.buffer);

/** Smallest float32 strictly greater than x (x finite). */
export function nextUpF32(x: number): number {
  const f = Math.fround(x);
  if (f > x) return f;
  if (f === 0) return 2 ** -149;
  F32[0] = f;
  if (f > 0) U32[0] = U32[0] + 1; else U32[0] = U32[0] - 1;
  return F32[0];
}

/** Smallest float32 ≥ x. */
export function ceilF32(x: number): number {
  const f = Math.fround(x);
  return f >= x ? f : nextUpF32(x);
}

/** Largest float32 strictly less than x (x finite). */
export function nextDownF32(x: number): number {
  return -nextUpF32(-x);
}
