/**
 * Entry counts a sample-count rule allows, as an increasing sequence indexed 0, 1, 2, …:
 * - any: N = 2, 3, 4, … up to maxEntries;
 * - power-of-two: N = 2, 4, 8, … (the entry count itself is a power of two);
 * - frame-aligned: N − 1 divides the domain's frame count F = D·fps (must be a whole number), so the
 *   step between entries is a whole number of frames.
 */
import type { SampleCountRule } from './profile';

export interface Candidates { size: number; at(i: number): number }

export function candidates(rule: SampleCountRule, duration: number, curveFps: number, maxEntries: number): Candidates | string {
  if (rule.rule === 'any') return { size: Math.max(0, maxEntries - 1), at: (i) => i + 2 };
  if (rule.rule === 'power-of-two') {
    const size = Math.floor(Math.log2(maxEntries));
    return { size, at: (i) => 2 ** (i + 1) };
  }
  const fps = rule.frameRate ?? curveFps;
  const F = duration * fps;
  const Fi = Math.round(F);
  if (!(Fi >= 1) || Math.abs(F - Fi) > 1e-6 * Math.max(1, F)) {
    return `frame-aligned needs a domain of whole frames: ${duration} s × ${fps} fps = ${F} frames`;
  }
  const list: number[] = [];
  for (let d = 1; d <= Fi && d + 1 <= maxEntries; d++) if (Fi % d === 0) list.push(d + 1);
  return { size: list.length, at: (i) => list[i] };
}
