/**
 * Snapping and step sizes. Pure functions over numbers.
 *
 * - Frame snapping rounds a time to the nearest frame of the document's frame rate:
 *   t' = round(t · fps) / fps.
 * - Value snapping rounds to a multiple of the "value step", a round number (1, 2 or 5 × 10ᵏ) chosen
 *   as the largest such number not above one hundredth of the curve's value range (range 0 counts as 1).
 *   The same step is what one arrow-key nudge moves a value by.
 */

export interface Snapping {
  frames: boolean;
  values: boolean;
}

export function snapTime(t: number, frameRate: number): number {
  const f = Math.round(t * frameRate);
  // dividing an integer by fps gives the nearest double to the frame time
  return f / frameRate + 0;
}

/** Round `v` to a multiple of `step`, written so that e.g. 0.3 with step 0.1 is exactly 0.3, not 0.30000000000000004. */
export function snapValue(v: number, step: number): number {
  const n = Math.round(v / step);
  if (step < 1) {
    const inv = Math.round(1 / step);
    if (Math.abs(inv * step - 1) < 1e-12) return n / inv + 0;
  }
  return n * step + 0;
}

/** The largest 1, 2 or 5 × 10ᵏ not above x (x > 0). */
export function niceStepBelow(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) return 1;
  const p = 10 ** Math.floor(Math.log10(x));
  const m = x / p;
  // guard log10 round-off: m is in [1, 10)
  const base = m >= 5 - 1e-9 ? 5 : m >= 2 - 1e-9 ? 2 : 1;
  return base * p;
}

/** The value step of a curve whose values span [min, max]. */
export function valueStepFor(min: number, max: number): number {
  const range = max - min;
  return niceStepBelow((range > 0 ? range : 1) / 100);
}
