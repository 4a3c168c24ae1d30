import type { Shape, ShapeFamily } from '../types';
import { back } from './back';
import { bounce } from './bounce';
import { circ } from './circ';
import { cubic } from './cubic';
import { elastic } from './elastic';
import { expo } from './expo';
import type { EaseFamily, ShapeBreak } from './family';
import { quad } from './quad';
import { quart } from './quart';
import { quint } from './quint';
import { sine } from './sine';
import { springFamily } from './spring';

/** Every shape family by name; each file holds one family's "in" form. */
export const FAMILIES: Readonly<Record<ShapeFamily, EaseFamily>> = {
  sine, quad, cubic, quart, quint, expo, circ, back, elastic, bounce, spring: springFamily,
};

/**
 * The value (order 0) or exact derivative d^k f/ds^k (order 1..4) of a shape on s ∈ [0, 1],
 * composed from its family's "in" form f as d3-ease 3.0.2 does:
 *   in:      f(s)
 *   out:     1 − f(1 − s),                       derivative −(−1)^k f^(k)(1 − s)
 *   in-out:  f(2s)/2 for s < ½                    derivative 2^(k−1) f^(k)(2s)
 *            1 − f(2 − 2s)/2 for s ≥ ½            derivative −(−1)^k 2^(k−1) f^(k)(2 − 2s)
 * At ½ the right-hand piece is used (right-continuous); values agree there.
 * `segmentDuration` (seconds, default 1) only matters for `spring`, whose physical time is
 * τ = s·segmentDuration; in in-out each half of a spring runs for half the segment.
 */
export function shapeValue(shape: Shape, s: number, order: 0 | 1 | 2 | 3 | 4 = 0, segmentDuration = 1): number {
  const fam = FAMILIES[shape.family];
  const p = shape.params;
  const ease = shape.ease;
  if (ease === 'in') return fam.value(s, order, p, segmentDuration);
  const sign = order % 2 === 0 ? -1 : 1; // −(−1)^k
  if (ease === 'out') {
    return order === 0 ? 1 - fam.value(1 - s, 0, p, segmentDuration) : sign * fam.value(1 - s, order, p, segmentDuration);
  }
  const half = segmentDuration / 2;
  const scale = Math.pow(2, order - 1);
  if (s < 0.5) return scale * fam.value(2 * s, order, p, half);
  return order === 0 ? 1 - fam.value(2 - 2 * s, 0, p, half) / 2 : sign * scale * fam.value(2 - 2 * s, order, p, half);
}

const breakCache = new Map<string, readonly ShapeBreak[]>();
/** The same lists by shape object (family and ease kept to notice a shape edited in place). */
const byShape = new WeakMap<Shape, { family: string; ease: string; breaks: readonly ShapeBreak[] }>();

/**
 * Points s ∈ (0, 1) where a derivative of order ≤ 4 of the shape jumps or is infinite, each with
 * the lowest such order (0 = value, 1 = slope …): the family's own breaks (bounce joints), mirrored
 * for out, halved and mirrored for in-out, plus s = ½ in in-out unless the join is smooth (sine).
 */
export function shapeBreakDetails(shape: Shape): readonly ShapeBreak[] {
  // first by the shape object itself (no key string per call: the baker asks on every derivative bound)
  const own = byShape.get(shape);
  if (own && own.family === shape.family && own.ease === shape.ease) return own.breaks;
  const key = `${shape.family}/${shape.ease}`;
  const hit = breakCache.get(key);
  if (hit) { byShape.set(shape, { family: shape.family, ease: shape.ease, breaks: hit }); return hit; }
  const fam = FAMILIES[shape.family];
  let out: ShapeBreak[];
  if (shape.ease === 'in') out = fam.breaks.slice();
  else if (shape.ease === 'out') out = fam.breaks.map((b) => ({ s: 1 - b.s, order: b.order }));
  else {
    out = fam.breaks.map((b) => ({ s: b.s / 2, order: b.order }));
    if (fam.inOutJoin <= 4) out.push({ s: 0.5, order: fam.inOutJoin });
    for (const b of fam.breaks) out.push({ s: 1 - b.s / 2, order: b.order });
  }
  out.sort((a, b) => a.s - b.s);
  breakCache.set(key, out);
  byShape.set(shape, { family: shape.family, ease: shape.ease, breaks: out });
  return out;
}

/** s-positions in (0, 1) where a derivative of order ≤ 4 jumps (see shapeBreakDetails). */
export function shapeBreaks(shape: Shape): number[] {
  return shapeBreakDetails(shape).map((b) => b.s);
}

/**
 * An upper bound of |d^k f/ds^k| over [s0, s1] ⊂ [0, 1] (k = order), never below the true
 * supremum: the family's bound mapped through the same composition as shapeValue, with
 * in-out split at ½. If the interval strictly contains a break of lower order than k,
 * the k-th derivative is unbounded there (a jump in f^(j) makes f^(j+1) a Dirac pulse)
 * and the result is Infinity; split intervals at shapeBreaks first.
 */
export function shapeDerivativeBound(
  shape: Shape, order: 1 | 2 | 3 | 4, s0: number, s1: number, segmentDuration = 1,
): number {
  let a = Math.max(0, Math.min(s0, s1));
  let b = Math.min(1, Math.max(s0, s1));
  if (a > b) { a = b = Math.min(1, Math.max(0, s0)); }
  for (const br of shapeBreakDetails(shape)) {
    if (br.order < order && br.s > a && br.s < b) return Infinity;
  }
  const fam = FAMILIES[shape.family];
  const p = shape.params;
  if (shape.ease === 'in') return fam.bound(order, a, b, p, segmentDuration);
  if (shape.ease === 'out') return fam.bound(order, 1 - b, 1 - a, p, segmentDuration);
  const half = segmentDuration / 2;
  const scale = Math.pow(2, order - 1);
  let m = 0;
  if (a < 0.5) m = Math.max(m, scale * fam.bound(order, 2 * a, 2 * Math.min(b, 0.5), p, half));
  if (b > 0.5 || a >= 0.5) m = Math.max(m, scale * fam.bound(order, 2 - 2 * b, 2 - 2 * Math.max(a, 0.5), p, half));
  return m;
}

export type { ShapeBreak, EaseFamily } from './family';
