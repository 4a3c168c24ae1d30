/** One-sided source values at a time, and table assembly shared by the two layouts. */
import type { BakeSource } from './source';
import { segmentAt } from './source';
import type { Profile } from './profile';
import { encodeArray, minMax, makeQuantizer, type Quantizer } from './encoding';
import type { Table } from './table';
import { finiteSlope } from './slopes';

// Imported functions used in the hot loops, held in module constants (a CommonJS bundle turns each
// call through an imported binding into a getter call on the exporting module).
const segmentAt_ = segmentAt;
const encodeArray_ = encodeArray;
const minMax_ = minMax;
const makeQuantizer_ = makeQuantizer;

/** Non-empty segment holding t from the left (the one ending at t when t is a key). */
export function segmentLeftOf(src: BakeSource, t: number): number {
  const S = src.times;
  let i = segmentAt_(src, t);
  if (S[i] >= t) {
    let j = i - 1;
    while (j >= 0 && !(S[j + 1] > S[j])) j--;
    if (j >= 0) i = j;
  }
  return i;
}

/** f^(order)(t⁻): the left limit (inside the domain; at the start the right value). */
export function leftValue(src: BakeSource, t: number, order: number): number {
  const i = segmentLeftOf(src, t);
  return src.value(i, Math.min(Math.max(t, src.times[i]), src.times[i + 1]), order);
}

/** f^(order)(t⁺): the right value (the segment holding t; at the end the last segment's left limit). */
export function rightValue(src: BakeSource, t: number, order: number): number {
  const i = segmentAt_(src, t);
  return src.value(i, Math.min(Math.max(t, src.times[i]), src.times[i + 1]), order);
}

/** leftValue(src, t, 1) made finite (./slopes.ts finiteSlope: the secant over w at a vertical tangent). */
export function leftSlope(src: BakeSource, t: number, w: number): number {
  const i = segmentLeftOf(src, t);
  const S = src.times;
  const u = Math.min(Math.max(t, S[i]), S[i + 1]);
  return finiteSlope(src, i, u, u <= S[i] ? 1 : -1, src.value(i, u, 1), w);
}

/** rightValue(src, t, 1) made finite (as leftSlope). */
export function rightSlope(src: BakeSource, t: number, w: number): number {
  const i = segmentAt_(src, t);
  const S = src.times;
  const u = Math.min(Math.max(t, S[i]), S[i + 1]);
  return finiteSlope(src, i, u, u >= S[i + 1] ? -1 : 1, src.value(i, u, 1), w);
}

/** Build a decoded table from exact knot data; quantizers default to the data's own min/max. */
export function assembleTable(
  profile: Profile, times: Float64Array, stored: Float32Array | null, values: Float64Array, slopes: Float64Array | null,
  qv?: Quantizer, qm?: Quantizer,
): Table {
  const e = profile.encoding;
  const [vlo, vhi] = minMax_(values);
  const ev = encodeArray_(qv ?? makeQuantizer_(e, vlo, vhi), values);
  let es = null;
  if (slopes) {
    const [slo, shi] = minMax_(slopes);
    es = encodeArray_(qm ?? makeQuantizer_(e, slo, shi), slopes);
  }
  const n = times.length;
  return {
    kernel: profile.kernel, layout: profile.layout, encoding: e, count: n,
    start: times[0], end: times[n - 1], times, timeCodes: stored,
    values: ev.decoded, valueCodes: ev.codes, valueOffset: ev.offset, valueScale: ev.scale,
    slopes: es ? es.decoded : null, slopeCodes: es ? es.codes : null,
    slopeOffset: es ? es.offset : 0, slopeScale: es ? es.scale : 1,
  };
}

/** Largest round-off of an encoded array against its exact data. */
export function roundOff(exact: Float64Array, decoded: Float64Array | null): number {
  if (!decoded) return 0;
  let m = 0;
  for (let i = 0; i < exact.length; i++) { const d = Math.abs(exact[i] - decoded[i]); if (d > m) m = d; }
  return m;
}
