/**
 * A baked table and the reference evaluator (the TypeScript twin of the C evaluator in
 * ./outputs/evaluator-c.ts; the emitted TypeScript module carries the same code, ./outputs/evaluator-ts.ts).
 *
 * Entries k = 0..N−1 hold a time T_k, a value V_k and (hermite) one slope M_k. Uniform tables store no
 * times: T_k = start + k·(end − start)/(N − 1). Adaptive times are non-decreasing; a repeated time is a
 * zero-length interval: with different values it is a jump, with equal values and different slopes a
 * slope break (the earlier entry carries the in-slope, the later the out-slope). Evaluation is
 * right-continuous: for T_k ≤ t < T_{k+1}, with H = T_{k+1} − T_k and s = (t − T_k)/H,
 *   linear:  V_k + s·(V_{k+1} − V_k)
 *   hermite: (2s³−3s²+1)V_k + H(s³−2s²+s)M_k + (−2s³+3s²)V_{k+1} + H(s³−s²)M_{k+1}
 * (glTF 2.0 Appendix C), and outside [T_0, T_{N−1}] the table clamps to V_0 / V_{N−1}.
 */
import type { Encoding, Kernel, Layout } from './profile';
import type { Codes } from './encoding';

export interface Table {
  kernel: Kernel;
  layout: Layout;
  encoding: Encoding;
  /** Stored entries N ≥ 2. */
  count: number;
  /** float32 start and end times. */
  start: number;
  end: number;
  /** Decoded entry times (uniform: computed in double from start/end). */
  times: Float64Array;
  /** Stored times (adaptive only). */
  timeCodes: Float32Array | null;
  values: Float64Array;
  valueCodes: Codes;
  valueOffset: number;
  valueScale: number;
  slopes: Float64Array | null;
  slopeCodes: Codes | null;
  slopeOffset: number;
  slopeScale: number;
}

/** Times of a uniform table of n entries on [start, end]. */
export function uniformTimes(start: number, end: number, n: number): Float64Array {
  const out = new Float64Array(n);
  const h = (end - start) / (n - 1);
  for (let k = 0; k < n; k++) out[k] = start + k * h;
  out[n - 1] = end;
  return out;
}

/** Index k of the interval holding t: largest k < N−1 with T_k ≤ t (binary search); −1 before T_0, N−1 from T_{N−1} on. */
export function tableInterval(times: Float64Array, t: number): number {
  const n = times.length;
  if (t < times[0]) return -1;
  if (t >= times[n - 1]) return n - 1;
  let lo = 0, hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (times[mid] <= t) lo = mid; else hi = mid;
  }
  return lo;
}

/** Evaluate a decoded table at t (double arithmetic). */
export function evalTable(tab: Pick<Table, 'kernel' | 'times' | 'values' | 'slopes'>, t: number): number {
  const T = tab.times, V = tab.values;
  const n = T.length;
  const k = tableInterval(T, t);
  if (k < 0) return V[0];
  if (k >= n - 1) return V[n - 1];
  const H = T[k + 1] - T[k];
  const s = (t - T[k]) / H;
  if (tab.kernel === 'linear' || !tab.slopes) return V[k] + s * (V[k + 1] - V[k]);
  const M = tab.slopes;
  const s2 = s * s, s3 = s2 * s;
  return (2 * s3 - 3 * s2 + 1) * V[k] + H * (s3 - 2 * s2 + s) * M[k] + (-2 * s3 + 3 * s2) * V[k + 1] + H * (s3 - s2) * M[k + 1];
}

/** Payload bytes: times (adaptive, 4 B each) + values + slopes (hermite), unpadded. */
export function payloadBytes(layout: Layout, kernel: Kernel, encodingBytes: number, n: number): number {
  return n * ((layout === 'adaptive' ? 4 : 0) + encodingBytes * (kernel === 'hermite' ? 2 : 1));
}
