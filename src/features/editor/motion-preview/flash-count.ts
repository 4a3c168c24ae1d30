/**
 * Flash counter for the WCAG 2.3.1 caution ("Three Flashes or Below Threshold", W3C WCAG 2.x).
 *
 * WCAG defines a general flash as a pair of opposing changes in relative luminance of 10 % or more
 * of the maximum relative luminance, where the darker image is below 0.80, and asks that nothing
 * flashes more than three times in any one-second period. A curve knows nothing of screen area,
 * colour or the luminance of the pixels it lights, so this is an APPROXIMATION on the curve's own
 * values, and it is what the editor implements:
 *
 *   1. Sample the curve at `sampleRate` Hz over its domain (plus one second past the end when the
 *      curve repeats or mirrors after it), plus every key time.
 *   2. R = max − min of the samples; a "change" is a monotone run between two turning points whose
 *      size is at least `fraction`·R (10 % of the value range). Turning points are found with that
 *      hysteresis, so wiggles smaller than 10 % of the range are not changes.
 *   3. A flash is a pair of opposing changes: in a window of `window` seconds holding n whole changes
 *      there are ⌊n/2⌋ flashes. The result is the largest count over all windows (each window starts
 *      at a change's start).
 *
 * The 0.80 darker-image condition and the area limits are not modelled (they need the rendered
 * picture), so this errs towards cautioning. The studio's own accessibility rules and the platform
 * holders' certification requirements take precedence over this check.
 */
import { evaluateMany, type PreparedCurve } from '../../../../shared/curve';

export interface FlashOptions {
  sampleRate?: number;
  fraction?: number;
  window?: number;
}

export interface FlashReport {
  /** Most flashes in any one window. */
  maxFlashes: number;
  /** Start time of that window (seconds). */
  windowStart: number;
  /** Every change found: [start, end] times. */
  changes: { start: number; end: number }[];
  /** max − min of the samples. */
  range: number;
}

/** The caution shows above this many flashes per second (WCAG 2.3.1: "more than three flashes"). */
export const FLASH_LIMIT = 3;

/** Changes (monotone runs of at least thr) in a sampled signal; turning points with hysteresis. */
export function findChanges(ts: ArrayLike<number>, vs: ArrayLike<number>, thr: number): { start: number; end: number }[] {
  const out: { start: number; end: number }[] = [];
  const n = ts.length;
  if (n < 2 || !(thr > 0)) return out;
  // before the first change the direction is unknown: track the lowest and highest points so far
  let minV = vs[0], minT = ts[0], maxV = vs[0], maxT = ts[0];
  let dir = 0;
  let baseV = 0, baseT = 0; // start of the current run (the last turning point)
  let extV = 0, extT = 0; // running extreme of the current run
  for (let k = 1; k < n; k++) {
    const v = vs[k], t = ts[k];
    if (dir === 0) {
      if (v < minV) { minV = v; minT = t; }
      if (v > maxV) { maxV = v; maxT = t; }
      if (maxV - minV >= thr) {
        // the run that reached the threshold started at whichever extreme came first
        if (minT <= maxT) { dir = 1; baseV = minV; baseT = minT; extV = maxV; extT = maxT; }
        else { dir = -1; baseV = maxV; baseT = maxT; extV = minV; extT = minT; }
      }
      continue;
    }
    if (dir * (v - extV) > 0) { extV = v; extT = t; continue; }
    if (dir * (extV - v) >= thr) {
      out.push({ start: baseT, end: extT });
      baseV = extV; baseT = extT;
      dir = -dir;
      extV = v; extT = t;
    }
  }
  if (dir !== 0 && Math.abs(extV - baseV) >= thr) out.push({ start: baseT, end: extT });
  return out;
}

/** Most flashes (pairs of changes) inside any window [w, w + window]. */
export function maxFlashesInWindow(changes: readonly { start: number; end: number }[], window = 1): { flashes: number; at: number } {
  let best = 0, at = changes.length ? changes[0].start : 0;
  let j = 0;
  for (let i = 0; i < changes.length; i++) {
    const limit = changes[i].start + window + 1e-9;
    if (j < i) j = i;
    while (j < changes.length && changes[j].end <= limit) j++;
    const f = Math.floor((j - i) / 2);
    if (f > best) { best = f; at = changes[i].start; }
  }
  return { flashes: best, at };
}

export function countFlashes(c: PreparedCurve, opts: FlashOptions = {}): FlashReport {
  const rate = opts.sampleRate ?? 240;
  const fraction = opts.fraction ?? 0.1;
  const window = opts.window ?? 1;
  const start = c.start;
  const end = c.end + (c.after === 'repeat' || c.after === 'mirror' ? window : 0);
  const steps = Math.max(1, Math.min(200_000, Math.ceil((end - start) * rate)));
  const grid = new Float64Array(steps + 1);
  for (let k = 0; k <= steps; k++) grid[k] = start + ((end - start) * k) / steps;
  // merge the key times in, so a peak between two samples is never missed
  const merged = new Float64Array(grid.length + c.count);
  let a = 0, b = 0, m = 0;
  while (a < grid.length || b < c.count) {
    const tk = b < c.count ? c.times[b] : Infinity;
    const tg = a < grid.length ? grid[a] : Infinity;
    const t = tk < tg ? (b++, tk) : (a++, tg);
    if (t > end) continue;
    if (m === 0 || t > merged[m - 1]) merged[m++] = t;
  }
  const ts = merged.subarray(0, m);
  const vs = evaluateMany(c, ts);
  let lo = Infinity, hi = -Infinity;
  for (let k = 0; k < m; k++) { if (vs[k] < lo) lo = vs[k]; if (vs[k] > hi) hi = vs[k]; }
  const range = hi - lo;
  if (!(range > 0)) return { maxFlashes: 0, windowStart: start, changes: [], range: 0 };
  const changes = findChanges(ts, vs, fraction * range);
  const w = maxFlashesInWindow(changes, window);
  return { maxFlashes: w.flashes, windowStart: w.at, changes, range };
}

/** The caution applies to curves that drive brightness or opacity and flash more than three times a second. */
export function needsFlashCaution(drives: string, report: FlashReport): boolean {
  return (drives === 'brightness' || drives === 'opacity') && report.maxFlashes > FLASH_LIMIT;
}
