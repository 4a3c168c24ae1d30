/**
 * Curve space (seconds, value units) ↔ screen space (CSS pixels inside the canvas). Pure.
 *
 * With the plot rectangle (x, y, w, h) and the view [t0, t1] × [v0, v1]:
 *   X(t) = x + (t − t0)·w/(t1 − t0)          T(X) = t0 + (X − x)·(t1 − t0)/w
 *   Y(v) = y + h − (v − v0)·h/(v1 − v0)      V(Y) = v0 + (y + h − Y)·(v1 − v0)/h
 * (values grow upwards, screen Y downwards).
 */
import type { View } from '../store/view';

export interface Plot {
  x: number;
  y: number;
  w: number;
  h: number;
}

export interface Transform {
  view: View;
  plot: Plot;
  /** Pixels per second and per value unit. */
  sx: number;
  sy: number;
}

/** Room for the value labels on the left and the time labels at the bottom. */
export const PLOT_MARGIN = { left: 60, right: 12, top: 12, bottom: 30 };

export function plotFor(width: number, height: number): Plot {
  return {
    x: PLOT_MARGIN.left,
    y: PLOT_MARGIN.top,
    w: Math.max(1, width - PLOT_MARGIN.left - PLOT_MARGIN.right),
    h: Math.max(1, height - PLOT_MARGIN.top - PLOT_MARGIN.bottom),
  };
}

export function makeTransform(view: View, plot: Plot): Transform {
  return { view, plot, sx: plot.w / (view.t1 - view.t0), sy: plot.h / (view.v1 - view.v0) };
}

export const toX = (tf: Transform, t: number): number => tf.plot.x + (t - tf.view.t0) * tf.sx;
export const toY = (tf: Transform, v: number): number => tf.plot.y + tf.plot.h - (v - tf.view.v0) * tf.sy;
export const toT = (tf: Transform, x: number): number => tf.view.t0 + (x - tf.plot.x) / tf.sx;
export const toV = (tf: Transform, y: number): number => tf.view.v0 + (tf.plot.y + tf.plot.h - y) / tf.sy;

/** Screen length of a slope handle, pixels. */
export const HANDLE_LENGTH = 46;

/**
 * Screen position of a key's slope handle: HANDLE_LENGTH pixels from the key along the slope's
 * direction on screen, (1, −slope·sy/sx) normalised (left of the key for the in-handle).
 */
export function handlePoint(tf: Transform, t: number, v: number, slope: number, side: 'in' | 'out'): { x: number; y: number } {
  const dx = 1;
  const dy = (-slope * tf.sy) / tf.sx;
  const len = Math.hypot(dx, dy);
  const s = (side === 'out' ? 1 : -1) * (HANDLE_LENGTH / len);
  return { x: toX(tf, t) + dx * s, y: toY(tf, v) + dy * s };
}
