/**
 * Where the source curve is not smooth. At each interior key time (equal times grouped), the left
 * limit comes from the last non-empty segment ending there and the right limit from the first one
 * starting there; `order` is the lowest derivative order 0..3 whose limits differ (0 = jump in value,
 * 1 = slope break, 2/3 = the join is only C¹/C²), or 4 when the limits agree up to the third
 * derivative. The end time is a jump when the end value differs from the last segment's left limit
 * (a step into the last key).
 */
import type { BakeSource } from './source';

export interface Break {
  time: number;
  order: number;
  /** Non-empty segment on the left and on the right (right = −1 at the end). */
  left: number;
  right: number;
  /** Value on the left (limit) and on the right (the curve's value there). */
  valueLeft: number;
  valueRight: number;
}

function differ(a: number, b: number): boolean {
  return Math.abs(a - b) > 1e-12 * (1 + Math.abs(a) + Math.abs(b));
}

/** Interior and end breaks with order ≤ maxOrder, in time order. */
export function findBreaks(src: BakeSource, maxOrder = 3): Break[] {
  const T = src.times;
  const n = T.length - 1;
  const out: Break[] = [];
  let i = 0;
  // skip leading zero-length segments (a jump at the very start is not observable: right-continuous)
  while (i < n && T[i + 1] === T[i]) i++;
  let left = -1;
  for (; i < n; i++) {
    if (T[i + 1] === T[i]) continue;
    if (left >= 0) {
      const t = T[i];
      let order = 4;
      for (let d = 0; d <= 3; d++) {
        if (differ(src.value(left, t, d), src.value(i, t, d))) { order = d; break; }
      }
      if (order <= maxOrder) {
        out.push({ time: t, order, left, right: i, valueLeft: src.value(left, t, 0), valueRight: src.value(i, t, 0) });
      }
    }
    left = i;
  }
  if (left >= 0) {
    const vl = src.value(left, T[n], 0);
    if (differ(vl, src.endValue)) out.push({ time: T[n], order: 0, left, right: -1, valueLeft: vl, valueRight: src.endValue });
  }
  if (src.cuts && src.cutOrders) {
    for (let c = 0; c < src.cuts.length; c++) {
      const t = src.cuts[c], order = src.cutOrders[c];
      if (order > maxOrder) continue;
      const i = segmentIndexInside(src, t);
      if (i < 0) continue;
      out.push({ time: t, order, left: i, right: i, valueLeft: src.value(i, t, 0), valueRight: src.value(i, t, 0) });
    }
    out.sort((a, b) => a.time - b.time || (a.right < 0 ? 1 : 0) - (b.right < 0 ? 1 : 0));
  }
  return out;
}

/** Segment i with times[i] < t < times[i+1], or −1. */
function segmentIndexInside(src: BakeSource, t: number): number {
  const T = src.times;
  for (let i = 0; i < T.length - 1; i++) if (T[i] < t && t < T[i + 1]) return i;
  return -1;
}
