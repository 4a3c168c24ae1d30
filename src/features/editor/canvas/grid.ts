/**
 * Grid lines and axis labels for a view: the renderer's tick maths. Pure.
 *
 * Major ticks are round numbers (1, 2 or 5 × 10ᵏ) spaced about `targetPx` apart. On the time axis
 * the minor lines are the frames of the document's frame rate when a frame is at least
 * MIN_FRAME_PX wide, else fifths of the major step.
 */
import { toX, toY, type Transform } from './transform';

export const MIN_FRAME_PX = 6;

/** The smallest 1, 2 or 5 × 10ᵏ not below x. */
export function niceStepAbove(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) return 1;
  const p = 10 ** Math.floor(Math.log10(x));
  const m = x / p;
  const base = m <= 1 + 1e-9 ? 1 : m <= 2 + 1e-9 ? 2 : m <= 5 + 1e-9 ? 5 : 10;
  return base * p;
}

/** Multiples of step inside [lo, hi], computed as integer × step (no accumulated round-off). */
export function ticks(lo: number, hi: number, step: number, max = 2000): number[] {
  const a = Math.ceil(lo / step - 1e-9);
  const b = Math.floor(hi / step + 1e-9);
  const out: number[] = [];
  // i/(1/step) when 1/step is a whole number: 3 × 0.2 is 0.6000000000000001, 3/5 is 0.6
  const inv = Math.round(1 / step);
  const exactInv = step < 1 && Math.abs(inv * step - 1) < 1e-12;
  for (let i = a; i <= b && out.length < max; i++) out.push((exactInv ? i / inv : i * step) + 0);
  return out;
}

export interface AxisLine {
  /** Screen coordinate (x for time lines, y for value lines). */
  at: number;
  value: number;
  major: boolean;
}

export interface Grid {
  time: AxisLine[];
  value: AxisLine[];
  timeStep: number;
  valueStep: number;
  /** True when the minor time lines are frames. */
  frames: boolean;
}

export function buildGrid(tf: Transform, frameRate: number, targetPx = 90): Grid {
  const { t0, t1, v0, v1 } = tf.view;
  const timeStep = niceStepAbove(targetPx / tf.sx);
  const valueStep = niceStepAbove((targetPx * 0.6) / tf.sy);
  const framePx = tf.sx / frameRate;
  const frames = framePx >= MIN_FRAME_PX;
  const time: AxisLine[] = [];
  const majorT = new Set(ticks(t0, t1, timeStep).map((t) => Math.round(t / timeStep)));
  const minorT = frames ? ticks(t0 * frameRate, t1 * frameRate, 1).map((f) => f / frameRate) : ticks(t0, t1, timeStep / 5);
  for (const t of minorT) {
    if (!majorT.has(Math.round(t / timeStep)) || Math.abs(t / timeStep - Math.round(t / timeStep)) > 1e-6) {
      time.push({ at: toX(tf, t), value: t, major: false });
    }
  }
  for (const m of majorT) time.push({ at: toX(tf, m * timeStep), value: m * timeStep + 0, major: true });
  const value: AxisLine[] = [];
  for (const v of ticks(v0, v1, valueStep / 5)) {
    const major = Math.abs(v / valueStep - Math.round(v / valueStep)) < 1e-6;
    value.push({ at: toY(tf, v), value: major ? Math.round(v / valueStep) * valueStep + 0 : v, major });
  }
  return { time, value, timeStep, valueStep, frames };
}

/** A label for a tick: as many decimals as the step needs (step 0.05 → 2 decimals). */
export function tickLabel(v: number, step: number): string {
  const decimals = Math.max(0, Math.min(10, -Math.floor(Math.log10(step) + 1e-9)));
  return (Math.abs(v) < step * 1e-6 ? 0 : v).toFixed(decimals);
}
