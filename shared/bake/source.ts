/**
 * What the baker needs from a curve, as plain functions over one curve's segments. The curve engine's
 * PreparedCurve is adapted to this in ./from-curve.ts; tests may build a source directly.
 *
 * Segment i joins key time times[i] and times[i + 1] (a zero-length segment is a jump in value).
 * `value(i, t, order)` evaluates the order-th derivative of segment i's own formula at t in the
 * closed segment [times[i], times[i+1]] — so at a key it gives the left (segment i−1) or right
 * (segment i) limit. `poly(i)` is the segment's exact cubic [c0, c1, c2, c3] in u = t − times[i]
 * (step, linear, hermite) or null (bezier, shape). `bound(i, order, ta, tb)` is an upper bound of
 * |f^(order)| on [ta, tb] inside segment i (Infinity when unknown).
 */
import type { SegmentKind } from '../curve/types';

export interface BakeSource {
  name: string;
  /** Key times, non-decreasing; length = segment count + 1. */
  times: Float64Array;
  kinds: readonly SegmentKind[];
  value(i: number, t: number, order: number): number;
  poly(i: number): Float64Array | null;
  bound(i: number, order: number, ta: number, tb: number): number;
  /** The curve's value at its end time (the last key's value; differs from the last segment's left limit after a step). */
  endValue: number;
  /**
   * Optional: times strictly inside segments where the segment's own function is not smooth (a shape's
   * inner joint, a bezier's vertical tangent), sorted, with the lowest derivative order that breaks there.
   */
  cuts?: Float64Array;
  cutOrders?: Uint8Array;
}

export function segmentCount(s: BakeSource): number {
  return s.times.length - 1;
}

/** Index of the segment holding t: the largest i < n with times[i] ≤ t (so times[i] < times[i+1] for
 * t inside the domain; right-continuous at jumps). Binary search; t outside maps to the first/last non-empty segment. */
export function segmentAt(s: BakeSource, t: number): number {
  const T = s.times;
  const n = T.length - 1;
  if (t < T[0]) return firstNonEmpty(s);
  if (t >= T[n]) return lastNonEmpty(s);
  let lo = 0, hi = n;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (T[mid] <= t) lo = mid; else hi = mid;
  }
  return lo;
}

export function firstNonEmpty(s: BakeSource): number {
  const T = s.times;
  for (let i = 0; i < T.length - 1; i++) if (T[i + 1] > T[i]) return i;
  return 0;
}

export function lastNonEmpty(s: BakeSource): number {
  const T = s.times;
  for (let i = T.length - 2; i >= 0; i--) if (T[i + 1] > T[i]) return i;
  return 0;
}

/**
 * The source curve at t: right-continuous at jumps; before the domain the start value, from the
 * end on the last key's value (so a step into the last key shows at the end time). Derivatives
 * (order ≥ 1) are the segment's own, 0 outside the domain.
 */
export function sourceValue(s: BakeSource, t: number, order = 0): number {
  const T = s.times;
  const n = T.length - 1;
  if (t < T[0]) return order === 0 ? s.value(firstNonEmpty(s), T[0], 0) : 0;
  if (t >= T[n]) return order === 0 ? s.endValue : 0;
  const i = segmentAt(s, t);
  return s.value(i, t, order);
}
