/**
 * Value and slope ranges of a source curve over its domain: exact on cubic segments (extremes at the
 * ends or at roots of the derivative), 65 equally spaced samples per segment otherwise. Used for the
 * relative tolerance (tolerance × value range) and for the unorm offset/scale of adaptive tables;
 * rangeWidthBound bounds the width from above without sampling (the unorm round-off check).
 */
import type { BakeSource } from './source';
import { CUBIC, SAMPLED, type Proxy } from './proxy';

export interface Range { min: number; max: number }

const SAMPLES = 64;

function consider(r: Range, x: number): void {
  if (x < r.min) r.min = x;
  if (x > r.max) r.max = x;
}

/** Ranges already found, per source and order (a source's segments do not change once built). */
const CACHE = new WeakMap<BakeSource, [Range | null, Range | null]>();

/** Range of f (order 0) or f' (order 1) over the domain, including the end value (computed once per source; read-only). */
export function sourceRange(src: BakeSource, order: 0 | 1): Readonly<Range> {
  let slot = CACHE.get(src);
  if (!slot) { slot = [null, null]; CACHE.set(src, slot); }
  return (slot[order] ??= computeRange(src, order));
}

/** Fold into r the exact range over u ∈ [0, L] of c0 + c1·u + c2·u² + c3·u³ (ends and critical points). */
function cubicRangeInto(r: Range, c0: number, c1: number, c2: number, c3: number, L: number): void {
  consider(r, c0 + 0 * (c1 + 0 * (c2 + 0 * c3)));
  consider(r, c0 + L * (c1 + L * (c2 + L * c3)));
  // critical points: c1 + 2c2 u + 3c3 u² = 0
  const A = 3 * c3, B = 2 * c2, C = c1;
  if (A !== 0) {
    const d = B * B - 4 * A * C;
    if (d >= 0) {
      const q = -0.5 * (B + (B >= 0 ? Math.sqrt(d) : -Math.sqrt(d)));
      if (q !== 0) {
        const u1 = q / A, u2 = C / q;
        if (u1 > 0 && u1 < L) consider(r, c0 + u1 * (c1 + u1 * (c2 + u1 * c3)));
        if (u2 > 0 && u2 < L) consider(r, c0 + u2 * (c1 + u2 * (c2 + u2 * c3)));
      }
    }
  } else if (B !== 0) {
    const u = -C / B;
    if (u > 0 && u < L) consider(r, c0 + u * (c1 + u * (c2 + u * c3)));
  }
}

/**
 * An upper bound of the width of the value range over the domain, without sampling: a cubic segment's
 * exact range, and on the other segments the range of each stand-in leaf's cubic (./proxy.ts) widened by
 * its proven distance to the source (a constant leaf: its value ± that distance), plus 1e-9 of the
 * magnitudes for rounding. At least sourceRange's width (its samples lie in the range). Infinity where a
 * segment has a leaf without a figure (left to sampling) or no stand-ins (P null).
 */
export function rangeWidthBound(src: BakeSource, P: Proxy | null): number {
  const T = src.times;
  const r: Range = { min: src.endValue, max: src.endValue };
  let err = 0;
  for (let i = 0; i < T.length - 1; i++) {
    const a = T[i], b = T[i + 1];
    if (!(b > a)) continue;
    const p = src.poly(i);
    if (p) { cubicRangeInto(r, p[0], p[1], p[2], p[3], b - a); continue; }
    if (!P || !(P.first[i + 1] > P.first[i])) return Infinity;
    for (let k = P.first[i]; k < P.first[i + 1]; k++) {
      if (P.kind[k] === SAMPLED) return Infinity;
      const o = 4 * k, c = P.c;
      if (P.kind[k] === CUBIC) cubicRangeInto(r, c[o], c[o + 1], c[o + 2], c[o + 3], P.b[k] - P.a[k]);
      else consider(r, c[o]);
      if (P.err[k] > err) err = P.err[k];
    }
  }
  const w = r.max - r.min + 2 * err;
  return w === w ? w + 1e-9 * (Math.abs(r.min) + Math.abs(r.max) + w) + 1e-300 : Infinity;
}

function computeRange(src: BakeSource, order: 0 | 1): Range {
  const T = src.times;
  const r: Range = { min: Infinity, max: -Infinity };
  for (let i = 0; i < T.length - 1; i++) {
    const a = T[i], b = T[i + 1];
    if (!(b > a)) continue;
    const L = b - a;
    const p = src.poly(i);
    if (p) {
      // order 1: the derivative polynomial p'(u) = c1 + 2c2 u + 3c3 u²
      if (order === 0) cubicRangeInto(r, p[0], p[1], p[2], p[3], L);
      else cubicRangeInto(r, p[1], 2 * p[2], 3 * p[3], 0, L);
    } else {
      // a non-finite sample (a vertical tangent's slope) is left out: entries take a finite slope
      // there (./slopes.ts) and the encoding clamps a slope outside the range; the measure decides
      for (let j = 0; j <= SAMPLES; j++) {
        const x = src.value(i, j === SAMPLES ? b : a + (j * L) / SAMPLES, order);
        if (Number.isFinite(x)) consider(r, x);
      }
    }
  }
  if (order === 0) consider(r, src.endValue);
  if (!Number.isFinite(r.min)) { r.min = 0; r.max = 0; }
  return r;
}
