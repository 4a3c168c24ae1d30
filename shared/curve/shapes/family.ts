import type { Shape } from '../types';

/** The optional numeric parameters of a shape (see ../types Shape). */
export type ShapeParams = Shape['params'];

/** A point in (0, 1) where a derivative of order `order` (0 = the value) jumps or becomes infinite. */
export interface ShapeBreak {
  s: number;
  order: number;
}

/**
 * One easing family, described by its "in" form f(s) on s ∈ [0, 1]. The `out`
 * and `in-out` forms are derived in ./compose.ts exactly as d3-ease 3.0.2 does:
 *   out(s)    = 1 − f(1 − s)
 *   inOut(s)  = f(2s)/2 for s < ½,  1 − f(2 − 2s)/2 for s ≥ ½.
 */
export interface EaseFamily {
  /** f^(order)(s) for order 0..4 (value and exact derivatives). */
  value(s: number, order: number, params: ShapeParams, duration: number): number;
  /**
   * An upper bound of |f^(order)| over [a, b] ⊂ [0, 1] (order 1..4), never below the
   * true supremum. Called only on intervals free of the family's own breaks of lower order.
   */
  bound(order: number, a: number, b: number, params: ShapeParams, duration: number): number;
  /** Breaks of f itself inside (0, 1). */
  breaks: readonly ShapeBreak[];
  /**
   * Lowest derivative order that jumps at s = ½ in the in-out form (5 if none up to 4).
   * The value and odd derivatives always match at ½ when f(1) = 1; even ones jump unless f^(k)(1) = 0.
   */
  inOutJoin: number;
}

/** Parameter defaults (d3-ease 3.0.2 for back and elastic; spring: common practice). */
export const DEFAULTS = {
  overshoot: 1.70158,
  amplitude: 1,
  period: 0.3,
  stiffness: 100,
  damping: 10,
  mass: 1,
  velocity: 0,
} as const;
