/**
 * Source text of the TypeScript evaluator the TypeScript output emits: the same formulas as
 * ../table.ts evalTable and the C evaluator (./evaluator-c.ts), on the stored codes, in double
 * arithmetic. Self-contained (no imports) so the emitted module runs anywhere.
 */
export const TS_EVALUATOR = `export type Codes = Float32Array | Uint16Array | Uint8Array;

export interface TangentryCurve {
  name: string;
  kernel: 'linear' | 'hermite';
  layout: 'uniform' | 'adaptive';
  encoding: 'f32' | 'f16' | 'unorm16' | 'unorm8';
  count: number;
  start: number;
  end: number;
  valueOffset: number;
  valueScale: number;
  slopeOffset: number;
  slopeScale: number;
  times: Float32Array | null;
  values: Codes;
  slopes: Codes | null;
}

/** IEEE 754 binary16 code to number (exact). */
function f16(h: number): number {
  const s = h & 0x8000 ? -1 : 1, e = (h >> 10) & 0x1f, f = h & 0x3ff;
  if (e === 0) return s * f * 2 ** -24;
  if (e === 31) return f ? NaN : s * Infinity;
  return s * (1 + f / 1024) * 2 ** (e - 15);
}

function decode(c: TangentryCurve, codes: Codes, i: number, off: number, scale: number): number {
  switch (c.encoding) {
    case 'f32': return codes[i];
    case 'f16': return f16(codes[i]);
    case 'unorm16': return off + scale * (codes[i] / 65535);
    default: return off + scale * (codes[i] / 255);
  }
}

/** Value of a baked curve at time t (seconds): right-continuous, clamped outside [start, end]. */
export function evaluate(c: TangentryCurve, t: number): number {
  const n = c.count;
  const V = (i: number) => decode(c, c.values, i, c.valueOffset, c.valueScale);
  let k: number, t0: number, t1: number;
  if (c.layout === 'uniform') {
    if (t <= c.start) return V(0);
    if (t >= c.end) return V(n - 1);
    const h = (c.end - c.start) / (n - 1);
    k = Math.min(Math.floor((t - c.start) / h), n - 2);
    t0 = c.start + k * h;
    t1 = k + 2 === n ? c.end : c.start + (k + 1) * h;
  } else {
    const T = c.times!;
    if (t < T[0]) return V(0);
    if (t >= T[n - 1]) return V(n - 1);
    let lo = 0, hi = n - 1;
    while (hi - lo > 1) { const mid = (lo + hi) >> 1; if (T[mid] <= t) lo = mid; else hi = mid; }
    k = lo; t0 = T[k]; t1 = T[k + 1];
  }
  const H = t1 - t0, s = (t - t0) / H, v0 = V(k), v1 = V(k + 1);
  if (c.kernel === 'linear') return v0 + s * (v1 - v0);
  const m0 = decode(c, c.slopes!, k, c.slopeOffset, c.slopeScale), m1 = decode(c, c.slopes!, k + 1, c.slopeOffset, c.slopeScale);
  const s2 = s * s, s3 = s2 * s;
  return (2 * s3 - 3 * s2 + 1) * v0 + H * (s3 - 2 * s2 + s) * m0 + (-2 * s3 + 3 * s2) * v1 + H * (s3 - s2) * m1;
}
`;
