/**
 * The curve as SVG path data: sampled with the curve engine's evaluateMany into reused
 * Float64Arrays (grown only when a larger view needs more samples), so redrawing during a drag
 * allocates no sample buffers.
 *
 * Inside the domain every visible segment is sampled on its own: its start, interior points about
 * `pxPerSample` pixels apart and its left limit at the end (segmentValue at t_{i+1}), so steps and
 * jumps are drawn as vertical lines exactly at their key, never smeared between two samples.
 * Outside the domain the outside rule is sampled the same way (drawn faintly by the canvas).
 */
import { evaluateMany, segmentValue, type PreparedCurve } from '../../../../shared/curve';
import { toX, toY, type Transform } from './transform';

let times = new Float64Array(4096);
let values = new Float64Array(4096);

function ensure(n: number): void {
  if (times.length >= n) return;
  let m = times.length;
  while (m < n) m *= 2;
  times = new Float64Array(m);
  values = new Float64Array(m);
}

/** Round to 0.01 px: shorter path strings, no visible difference. */
const r = (x: number) => Math.round(x * 100) / 100;

/** Path data of the curve inside its domain, clipped to the view's time range. */
export function domainPath(c: PreparedCurve, tf: Transform, pxPerSample = 2): string {
  const { t0, t1 } = tf.view;
  const n = c.count;
  if (n === 0) return '';
  if (n === 1) {
    const y = r(toY(tf, c.values[0]));
    return `M${r(toX(tf, Math.max(t0, c.times[0])))},${y}H${r(toX(tf, Math.max(t0, c.times[0])) + 0.01)}`;
  }
  const dtPer = pxPerSample / tf.sx;
  let first = 0;
  while (first < n - 2 && c.times[first + 1] < t0) first++;
  let last = n - 2;
  while (last > first && c.times[last] > t1) last--;
  // count samples first so one buffer fill serves the whole path
  let total = 0;
  for (let i = first; i <= last; i++) {
    const a = Math.max(c.times[i], t0), b = Math.min(c.times[i + 1], t1);
    total += 2 + (b > a ? Math.min(4000, Math.floor((b - a) / dtPer)) : 0);
  }
  ensure(total);
  let m = 0;
  const ends: number[] = [];
  for (let i = first; i <= last; i++) {
    const ta = c.times[i], tb = c.times[i + 1];
    const a = Math.max(ta, t0), b = Math.min(tb, t1);
    times[m++] = a;
    const inner = b > a ? Math.min(4000, Math.floor((b - a) / dtPer)) : 0;
    for (let j = 1; j <= inner; j++) times[m++] = a + ((b - a) * j) / (inner + 1);
    ends.push(m);
    times[m++] = b;
  }
  evaluateMany(c, times.subarray(0, m), values);
  // the end sample of each segment is its left limit (a step holds its value up to the next key)
  let e = 0;
  for (let i = first; i <= last; i++, e++) {
    const at = ends[e];
    if (times[at] >= c.times[i + 1] && c.times[i + 1] > c.times[i]) values[at] = segmentValue(c, i, c.times[i + 1], 0);
  }
  let d = `M${r(toX(tf, times[0]))},${r(toY(tf, values[0]))}`;
  for (let k = 1; k < m; k++) d += `L${r(toX(tf, times[k]))},${r(toY(tf, values[k]))}`;
  // the last key's own value (after a final step the curve reaches it only at the end time)
  if (c.end <= t1 && c.end >= t0) d += `L${r(toX(tf, c.end))},${r(toY(tf, c.values[n - 1]))}`;
  return d;
}

/** Path data of the curve outside its domain (before and after), per the outside rules. */
export function outsidePaths(c: PreparedCurve, tf: Transform, pxPerSample = 3): { before: string; after: string } {
  const { t0, t1 } = tf.view;
  const side = (a: number, b: number): string => {
    if (!(b > a)) return '';
    const steps = Math.max(2, Math.min(4000, Math.ceil(((b - a) * tf.sx) / pxPerSample)));
    ensure(steps + 1);
    for (let j = 0; j <= steps; j++) times[j] = a + ((b - a) * j) / steps;
    evaluateMany(c, times.subarray(0, steps + 1), values);
    let d = `M${r(toX(tf, times[0]))},${r(toY(tf, values[0]))}`;
    for (let j = 1; j <= steps; j++) d += `L${r(toX(tf, times[j]))},${r(toY(tf, values[j]))}`;
    return d;
  };
  return { before: side(t0, Math.min(c.start, t1)), after: side(Math.max(c.end, t0), t1) };
}

/** Path data of a band from (times, lo) to (times, hi): an outline closed around both edges. */
export function bandPath(tf: Transform, ts: ArrayLike<number>, lo: ArrayLike<number>, hi: ArrayLike<number>, minHalfPx = 1): string {
  const n = ts.length;
  if (n < 2) return '';
  let d = '';
  for (let k = 0; k < n; k++) {
    const mid = (toY(tf, lo[k]) + toY(tf, hi[k])) / 2;
    const half = Math.max(minHalfPx, Math.abs(toY(tf, lo[k]) - toY(tf, hi[k])) / 2);
    d += `${k ? 'L' : 'M'}${r(toX(tf, ts[k]))},${r(mid - half)}`;
  }
  for (let k = n - 1; k >= 0; k--) {
    const mid = (toY(tf, lo[k]) + toY(tf, hi[k])) / 2;
    const half = Math.max(minHalfPx, Math.abs(toY(tf, lo[k]) - toY(tf, hi[k])) / 2);
    d += `L${r(toX(tf, ts[k]))},${r(mid + half)}`;
  }
  return d + 'Z';
}
