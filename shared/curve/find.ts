import type { PreparedCurve } from './prepare';

/**
 * The segment holding time t: the index i with times[i] ≤ t < times[i+1]; t at or past the end
 * gives the last segment (count − 2) and t before the start gives 0. A zero-length (jump)
 * segment never holds a time, so at a jump time the later segment is found (right-continuous).
 * −1 for a single-key curve (no segments).
 *
 * Lookup as three.js Interpolant does: the cached last index, then a short scan to the
 * neighbours (playback moves forward), then binary search for the largest i ≤ count − 2 with
 * times[i] ≤ t. No allocation.
 */
export function findSegment(c: PreparedCurve, t: number): number {
  const n = c.count;
  if (n < 2) return -1;
  const times = c.times;
  const last = n - 2;
  if (t >= times[n - 1]) return last;
  if (!(t >= times[0])) return 0;
  let i = c.cache[0];
  if (i > last) i = last;
  if (times[i] <= t) {
    if (t < times[i + 1]) return i;
    // forward scan of up to two segments
    if (i + 1 <= last && t < times[i + 2]) return (c.cache[0] = i + 1);
    if (i + 2 <= last && times[i + 2] <= t && t < times[i + 3]) return (c.cache[0] = i + 2);
  } else if (i > 0 && times[i - 1] <= t && t < times[i]) {
    return (c.cache[0] = i - 1);
  }
  let lo = 0;
  let hi = n - 1; // answer in [lo, hi)
  while (hi - lo > 1) {
    const mid = (lo + hi) >>> 1;
    if (times[mid] <= t) lo = mid;
    else hi = mid;
  }
  if (lo > last) lo = last;
  c.cache[0] = lo;
  return lo;
}
