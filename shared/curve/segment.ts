import { bezierEase, bezierEaseBound } from './bezier';
import { maxAbsCubic, SAFETY } from './extrema';
import type { PreparedCurve } from './prepare';

// Segment kinds are compared as literals (KIND_STEP = 0 … KIND_SHAPE = 4 in ./prepare): an imported
// binding costs a property load per comparison once bundled to CommonJS, in the hottest loop.
import { shapeDerivativeBound, shapeValue } from './shapes';

// Imported functions used in the hot loops, held in module constants (a CommonJS bundle turns each
// call through an imported binding into a getter call on the exporting module).
const bezierEase_ = bezierEase;
const bezierEaseBound_ = bezierEaseBound;
const maxAbsCubic_ = maxAbsCubic;
const shapeValue_ = shapeValue;
const shapeDerivativeBound_ = shapeDerivativeBound;
const SAFETY_ = SAFETY;

/**
 * The value (order 0) or d^k/dt^k (order 1..4) of segment i's own function at time t, without
 * looking at other segments, so the left limit at times[i+1] is segmentValue(c, i, times[i+1]).
 *   step:     v_i (derivatives 0)
 *   linear, hermite: Horner on the power basis c0 + c1u + c2u² + c3u³, u = t − t_i
 *   bezier:   CSS cubic-bezier over the segment (./bezier), d^k/dX^k divided by h^k
 *   shape:    v_i + Δv·f(s), s = (t − t_i)/h, derivatives Δv·f^(k)(s)/h^k (./shapes)
 * A zero-length (jump) segment gives v_{i+1} and derivatives 0. No allocation.
 */
export function segmentValue(c: PreparedCurve, i: number, t: number, order: 0 | 1 | 2 | 3 | 4 = 0): number {
  const t0 = c.times[i];
  const h = c.times[i + 1] - t0;
  if (!(h > 0)) return order === 0 ? c.values[i + 1] : 0;
  switch (c.kinds[i]) {
    case 0 /* KIND_STEP */:
      return order === 0 ? c.values[i] : 0;
    case 1 /* KIND_LINEAR */:
    case 2 /* KIND_HERMITE */: {
      const k = 4 * i;
      const q = c.coef;
      const u = t - t0;
      switch (order) {
        case 0: return q[k] + u * (q[k + 1] + u * (q[k + 2] + u * q[k + 3]));
        case 1: return q[k + 1] + u * (2 * q[k + 2] + 3 * u * q[k + 3]);
        case 2: return 2 * q[k + 2] + 6 * u * q[k + 3];
        case 3: return 6 * q[k + 3];
        default: return 0;
      }
    }
    case 3 /* KIND_BEZIER */: {
      const b = c.bez;
      const o = 6 * i;
      const v = bezierEase_(b[o], b[o + 1], b[o + 2], b[o + 3], b[o + 4], b[o + 5], (t - t0) / h, order);
      return order === 0 ? v : v / Math.pow(h, order);
    }
    default: {
      const shape = c.shapes[i];
      const v0 = c.values[i];
      const dv = c.values[i + 1] - v0;
      if (!shape) return order === 0 ? v0 : 0;
      const f = shapeValue_(shape, (t - t0) / h, order, h);
      return order === 0 ? v0 + dv * f : (dv * f) / Math.pow(h, order);
    }
  }
}

/**
 * The exact power-basis polynomial [c0, c1, c2, c3] of segment i in u = t − times[i]
 * (step [v_i, 0, 0, 0]; linear the chord; hermite the glTF 2.0 Appendix C basis converted, see
 * hermitePower; a zero-length segment [v_{i+1}, 0, 0, 0]); null for bezier and shape segments.
 * A new array each call.
 */
export function segmentPolynomial(c: PreparedCurve, i: number): Float64Array | null {
  const kind = c.kinds[i];
  const h = c.times[i + 1] - c.times[i];
  if (h > 0 && (kind === 3 /* KIND_BEZIER */ || kind === 4 /* KIND_SHAPE */)) return null;
  return c.coef.slice(4 * i, 4 * i + 4);
}

/**
 * An upper bound of |f^(order)(t)| over [ta, tb] ∩ segment i (the segment's own function), never
 * below the true supremum:
 *   step, zero-length: 0;  linear: |c1| for order 1, else 0;
 *   hermite: exact max of the derivative polynomial over the interval (ends + critical point);
 *   shape:   |Δv|·shapeDerivativeBound_(shape, order, sa, sb, h)/h^order (Infinity across a lower-order break);
 *   bezier:  interval bound of the chain-rule formulas (bezierEaseBound)/h^order, Infinity where
 *            the time parameterisation has a vertical tangent.
 * Results carry a relative 1e-12 inflation against rounding.
 */
export function segmentDerivativeBound(
  c: PreparedCurve, i: number, order: 1 | 2 | 3 | 4, ta: number, tb: number,
): number {
  const t0 = c.times[i];
  const t1 = c.times[i + 1];
  const h = t1 - t0;
  if (!(h > 0)) return 0;
  let a = Math.max(t0, Math.min(ta, tb));
  let b = Math.min(t1, Math.max(ta, tb));
  if (a > b) a = b = Math.min(t1, Math.max(t0, ta));
  switch (c.kinds[i]) {
    case 0 /* KIND_STEP */:
      return 0;
    case 1 /* KIND_LINEAR */:
      return order === 1 ? Math.abs(c.coef[4 * i + 1]) : 0;
    case 2 /* KIND_HERMITE */: {
      const k = 4 * i;
      const q = c.coef;
      const ua = a - t0;
      const ub = b - t0;
      switch (order) {
        case 1: return maxAbsCubic_(q[k + 1], 2 * q[k + 2], 3 * q[k + 3], 0, ua, ub) * SAFETY_;
        case 2: return maxAbsCubic_(2 * q[k + 2], 6 * q[k + 3], 0, 0, ua, ub) * SAFETY_;
        case 3: return Math.abs(6 * q[k + 3]) * SAFETY_;
        default: return 0;
      }
    }
    case 3 /* KIND_BEZIER */: {
      const o = 6 * i;
      const bz = c.bez;
      const r = bezierEaseBound_(bz[o], bz[o + 1], bz[o + 2], bz[o + 3], bz[o + 4], bz[o + 5], order, (a - t0) / h, (b - t0) / h);
      return r / Math.pow(h, order);
    }
    default: {
      const shape = c.shapes[i];
      const dv = Math.abs(c.values[i + 1] - c.values[i]);
      if (!shape || dv === 0) return 0;
      return (dv * shapeDerivativeBound_(shape, order, (a - t0) / h, (b - t0) / h, h)) / Math.pow(h, order);
    }
  }
}
