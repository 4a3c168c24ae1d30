/**
 * The canvas view: which part of the (time, value) plane is shown. Pure functions; the screen
 * transform that uses a view lives in ../canvas/transform.ts.
 */
import type { CurveDocument } from '../../../../shared/curve';

export interface View {
  /** Visible time range, seconds. */
  t0: number;
  t1: number;
  /** Visible value range, curve units. */
  v0: number;
  v1: number;
}

/** Smallest visible span on either axis (keeps the transform finite). */
export const MIN_SPAN = 1e-6;
/** Largest visible span on either axis. */
export const MAX_SPAN = 1e9;

/**
 * The view that shows the whole domain and every key's value, with a margin of `margin` (a fraction
 * of the span) on each side; a constant curve gets a value span of 1 (or 10 % of its magnitude).
 */
export function fitView(doc: CurveDocument, margin = 0.08): View {
  const keys = doc.keys;
  let t0 = keys[0].time, t1 = keys[keys.length - 1].time;
  let v0 = Infinity, v1 = -Infinity;
  for (const k of keys) {
    if (k.value < v0) v0 = k.value;
    if (k.value > v1) v1 = k.value;
  }
  for (const s of doc.segments) {
    if (s.bezier) {
      v0 = Math.min(v0, s.bezier.h1.value, s.bezier.h2.value);
      v1 = Math.max(v1, s.bezier.h1.value, s.bezier.h2.value);
    }
  }
  if (!(t1 > t0)) { t0 -= 0.5; t1 += 0.5; }
  if (!(v1 > v0)) {
    const h = Math.max(Math.abs(v0) * 0.1, 0.5);
    v0 -= h; v1 += h;
  }
  const mt = (t1 - t0) * margin, mv = (v1 - v0) * margin;
  return { t0: t0 - mt, t1: t1 + mt, v0: v0 - mv, v1: v1 + mv };
}

/**
 * Zoom by `factor` (> 1 zooms in) about the point (t, v), which stays where it is on screen:
 * t0' = t − (t − t0)/factor, t1' = t + (t1 − t)/factor (same for values). `axis` limits the zoom
 * to time or value. Spans stay within [MIN_SPAN, MAX_SPAN].
 */
export function zoomView(view: View, factor: number, t: number, v: number, axis: 'both' | 'time' | 'value' = 'both'): View {
  const clampF = (span: number) => {
    const next = span / factor;
    if (next < MIN_SPAN) return span / MIN_SPAN;
    if (next > MAX_SPAN) return span / MAX_SPAN;
    return factor;
  };
  let { t0, t1, v0, v1 } = view;
  if (axis !== 'value') {
    const f = clampF(t1 - t0);
    t0 = t - (t - t0) / f;
    t1 = t + (t1 - t) / f;
  }
  if (axis !== 'time') {
    const f = clampF(v1 - v0);
    v0 = v - (v - v0) / f;
    v1 = v + (v1 - v) / f;
  }
  return { t0, t1, v0, v1 };
}

/** Shift the view by (dt, dv) in curve units. */
export function panView(view: View, dt: number, dv: number): View {
  return { t0: view.t0 + dt, t1: view.t1 + dt, v0: view.v0 + dv, v1: view.v1 + dv };
}
