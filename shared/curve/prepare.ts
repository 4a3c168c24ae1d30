import { bezierEndSlope, bezierStartSlope } from './bezier';
import { shapeValue } from './shapes';
import { resolveSlopes } from './slopes';
import type { CurveDocument, Key, OutsideRule, SegmentKind, Shape } from './types';
import { SEGMENT_KINDS } from './types';

/** Index of each segment kind in SEGMENT_KINDS (the `kinds` array of a PreparedCurve). */
export const KIND_STEP = 0;
export const KIND_LINEAR = 1;
export const KIND_HERMITE = 2;
export const KIND_BEZIER = 3;
export const KIND_SHAPE = 4;

/**
 * A curve ready for fast evaluation: slope rules resolved and per-segment data in typed arrays,
 * computed once by prepareCurve. Treat it as immutable; only `cache` (the last segment found)
 * changes during evaluation.
 */
export interface PreparedCurve {
  /** The document as given. */
  readonly doc: CurveDocument;
  /** The keys after slope rules (resolveSlopes). */
  readonly keys: readonly Key[];
  /** Number of keys. */
  readonly count: number;
  readonly times: Float64Array;
  readonly values: Float64Array;
  /** Slopes after slope rules, value units per second. */
  readonly slopesIn: Float64Array;
  readonly slopesOut: Float64Array;
  /** Per segment, index into SEGMENT_KINDS (KIND_STEP … KIND_SHAPE). */
  readonly kinds: Uint8Array;
  /** Domain [start, end] = [first key time, last key time]. */
  readonly start: number;
  readonly end: number;
  readonly before: OutsideRule;
  readonly after: OutsideRule;
  /**
   * 4 per segment: power basis c0..c3 of the segment in u = t − times[i] for step, linear and
   * hermite segments (zeros for bezier/shape; [v_{i+1}, 0, 0, 0] for a zero-length jump segment).
   */
  readonly coef: Float64Array;
  /** 6 per segment for bezier: normalised handle times x1, x2 ∈ [0, 1] and values y0, y1, y2, y3. */
  readonly bez: Float64Array;
  /** Per segment: the shape of a shape segment, else null. */
  readonly shapes: readonly (Shape | null)[];
  /** Value and slope used by `extend` before the start and after the end (see evaluate.ts). */
  readonly extendBefore: { readonly value: number; readonly slope: number };
  readonly extendAfter: { readonly value: number; readonly slope: number };
  /** [last segment index found]; the only mutable state. */
  readonly cache: Int32Array;
}

/**
 * Power basis of the glTF 2.0 Appendix C cubic Hermite segment. With h = t_{k+1} − t_k,
 * s = u/h, p0 = v_k, p1 = v_{k+1}, m0 = out-slope b_k, m1 = in-slope a_{k+1} (per second):
 *   v = (2s³−3s²+1)p0 + h(s³−2s²+s)m0 + (−2s³+3s²)p1 + h(s³−s²)m1
 * expands to v = c0 + c1·u + c2·u² + c3·u³ with
 *   c0 = p0,  c1 = m0,  c2 = (3δ − 2m0 − m1)/h,  c3 = (m0 + m1 − 2δ)/h²,  δ = (p1 − p0)/h.
 */
export function hermitePower(p0: number, p1: number, m0: number, m1: number, h: number, out: Float64Array, at: number): void {
  const d = (p1 - p0) / h;
  out[at] = p0;
  out[at + 1] = m0;
  out[at + 2] = (3 * d - 2 * m0 - m1) / h;
  out[at + 3] = (m0 + m1 - 2 * d) / (h * h);
}

/**
 * Resolve slope rules and precompute every segment's data (see PreparedCurve). The document must be
 * valid (parseCurveDocument); a wrong segment count throws a RangeError naming the field.
 */
export function prepareCurve(doc: CurveDocument): PreparedCurve {
  const keys = resolveSlopes(doc.keys);
  const n = keys.length;
  const segs = Math.max(0, n - 1);
  if (doc.segments.length !== segs) {
    throw new RangeError(`segments: expected keys.length − 1 = ${segs} entries, got ${doc.segments.length}`);
  }
  const times = new Float64Array(n);
  const values = new Float64Array(n);
  const slopesIn = new Float64Array(n);
  const slopesOut = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    times[i] = keys[i].time;
    values[i] = keys[i].value;
    slopesIn[i] = keys[i].slopeIn;
    slopesOut[i] = keys[i].slopeOut;
  }
  const kinds = new Uint8Array(segs);
  const coef = new Float64Array(4 * segs);
  const bez = new Float64Array(6 * segs);
  const shapes: (Shape | null)[] = [];
  for (let i = 0; i < segs; i++) {
    const seg = doc.segments[i];
    const kind = SEGMENT_KINDS.indexOf(seg.kind as SegmentKind);
    kinds[i] = kind;
    shapes.push(kind === KIND_SHAPE && seg.shape ? seg.shape : null);
    const h = times[i + 1] - times[i];
    if (!(h > 0)) {
      coef[4 * i] = values[i + 1];
      continue;
    }
    if (kind === KIND_STEP) coef[4 * i] = values[i];
    else if (kind === KIND_LINEAR) {
      coef[4 * i] = values[i];
      coef[4 * i + 1] = (values[i + 1] - values[i]) / h;
    } else if (kind === KIND_HERMITE) {
      hermitePower(values[i], values[i + 1], slopesOut[i], slopesIn[i + 1], h, coef, 4 * i);
    } else if (kind === KIND_BEZIER && seg.bezier) {
      bez[6 * i] = (seg.bezier.h1.time - times[i]) / h;
      bez[6 * i + 1] = (seg.bezier.h2.time - times[i]) / h;
      bez[6 * i + 2] = values[i];
      bez[6 * i + 3] = seg.bezier.h1.value;
      bez[6 * i + 4] = seg.bezier.h2.value;
      bez[6 * i + 5] = values[i + 1];
    }
  }
  const c = {
    doc, keys, count: n, times, values, slopesIn, slopesOut, kinds,
    start: n ? times[0] : 0, end: n ? times[n - 1] : 0,
    before: doc.before, after: doc.after, coef, bez, shapes,
    extendBefore: { value: n ? values[0] : 0, slope: 0 },
    extendAfter: { value: n ? values[n - 1] : 0, slope: 0 },
    cache: new Int32Array(1),
  };
  // `extend`: the first/last segment of positive length gives the slope (see evaluate.ts).
  for (let i = 0; i < segs; i++) {
    if (times[i + 1] > times[i]) { c.extendBefore.slope = edgeSlope(c, i, true); break; }
  }
  for (let i = segs - 1; i >= 0; i--) {
    if (times[i + 1] > times[i]) { c.extendAfter.slope = edgeSlope(c, i, false); break; }
  }
  return c;
}

/**
 * One-sided slope of segment i at its start (atStart) or end: step 0; linear the chord; hermite
 * the key's out-/in-slope; bezier the CSS Easing extension direction (P0→P1, else P0→P2 / P2→P3,
 * else P1→P3); shape Δv·f'(0 or 1)/h.
 */
function edgeSlope(c: Omit<PreparedCurve, 'extendBefore' | 'extendAfter'>, i: number, atStart: boolean): number {
  const h = c.times[i + 1] - c.times[i];
  switch (c.kinds[i]) {
    case KIND_STEP: return 0;
    case KIND_LINEAR: return c.coef[4 * i + 1];
    case KIND_HERMITE: return atStart ? c.slopesOut[i] : c.slopesIn[i + 1];
    case KIND_BEZIER: {
      const b = c.bez;
      const o = 6 * i;
      const d = atStart
        ? bezierStartSlope(b[o], b[o + 1], b[o + 2], b[o + 3], b[o + 4])
        : bezierEndSlope(b[o], b[o + 1], b[o + 3], b[o + 4], b[o + 5]);
      return d / h;
    }
    default: {
      const shape = c.shapes[i];
      if (!shape) return 0;
      const dv = c.values[i + 1] - c.values[i];
      return dv === 0 ? 0 : (dv * shapeValue(shape, atStart ? 0 : 1, 1, h)) / h;
    }
  }
}
