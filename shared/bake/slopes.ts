/**
 * Finite entry slopes for hermite tables, and the source's vertical tangents.
 *
 * A shape or bezier segment can have an infinite derivative (circ at its ends or its in-out join, a
 * bezier whose handle makes dx/ds = 0). A table entry there cannot take the source's derivative as its
 * slope: ±Infinity in a Hermite basis gives NaN everywhere in the interval. Where the derivative is not
 * finite, or larger than SLOPE_CAP_FACTOR × (the segment's value scale) / (segment length), the entry
 * takes the secant over `w` into the segment on the side the slope belongs to (clamped to the segment):
 * a finite number that, by the mean value theorem, is the derivative somewhere in that stretch. The
 * measurement then decides whether the table is within the tolerance. Polynomial segments (step,
 * linear, hermite) always have finite derivatives and keep their exact slopes.
 */
import type { BakeSource } from './source';
import type { Break } from './breaks';

/** A slope is "absurd" above this many times value-scale / segment-length (far above any real ease). */
export const SLOPE_CAP_FACTOR = 1e6;

const CAPS = new WeakMap<BakeSource, Float64Array>();

/** Per-segment slope caps (Infinity for polynomial and empty segments), computed once per source. */
/** The source slopeCaps answered last (entries of one table ask for the same source many times). */
let lastSource: BakeSource | null = null, lastCaps: Float64Array | null = null;

export function slopeCaps(src: BakeSource): Float64Array {
  if (src === lastSource) return lastCaps!;
  let caps = CAPS.get(src);
  if (caps) { lastSource = src; lastCaps = caps; return caps; }
  const S = src.times, ns = S.length - 1;
  caps = new Float64Array(ns).fill(Infinity);
  for (let i = 0; i < ns; i++) {
    const a = S[i], b = S[i + 1];
    if (!(b > a) || src.poly(i)) continue;
    let lo = Infinity, hi = -Infinity, mag = 0;
    for (let j = 0; j <= 8; j++) {
      const v = src.value(i, j === 8 ? b : a + ((b - a) * j) / 8, 0);
      if (!Number.isFinite(v)) continue;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
      mag = Math.max(mag, Math.abs(v));
    }
    const scale = Math.max(hi > lo ? hi - lo : 0, 1e-12 * (1 + mag));
    caps[i] = (SLOPE_CAP_FACTOR * scale) / (b - a);
  }
  CAPS.set(src, caps);
  lastSource = src; lastCaps = caps;
  return caps;
}

/** Whether an entry in segment i takes the derivative m itself as its slope (finite and within the cap; whatever the secant's width). */
export function keepsDerivative(src: BakeSource, i: number, m: number): boolean {
  return Number.isFinite(m) && Math.abs(m) <= slopeCaps(src)[i];
}

/**
 * The slope an entry at t takes from segment i: `m` (the source's derivative there) when finite and
 * within the cap, else the secant from t over w toward side (+1: later times, −1: earlier), clamped
 * to the segment; 0 if even that is not finite.
 */
export function finiteSlope(src: BakeSource, i: number, t: number, side: 1 | -1, m: number, w: number): number {
  if (keepsDerivative(src, i, m)) return m;
  const S = src.times;
  const a = S[i], b = S[i + 1];
  let u = side > 0 ? Math.min(t + w, b) : Math.max(t - w, a);
  if (u === t) u = side > 0 ? b : a;
  if (u === t) return 0;
  const s = (src.value(i, u, 0) - src.value(i, t, 0)) / (u - t);
  return Number.isFinite(s) ? s : 0;
}

/**
 * Times where the source's derivative is infinite or beyond the slope cap: segment ends and inner cuts
 * of shape/bezier segments (for error messages).
 */
export function verticalTangents(src: BakeSource): number[] {
  const S = src.times, ns = S.length - 1;
  const caps = slopeCaps(src);
  const out: number[] = [];
  const steep = (i: number, t: number, d: number): boolean => {
    const m = src.value(i, t + d, 1);
    return !(Math.abs(m) <= caps[i]);
  };
  for (let i = 0; i < ns; i++) {
    if (!(S[i + 1] > S[i]) || src.poly(i)) continue;
    if (steep(i, S[i], 0)) out.push(S[i]);
    if (steep(i, S[i + 1], 0)) out.push(S[i + 1]);
  }
  if (src.cuts) {
    for (const t of src.cuts) {
      for (let i = 0; i < ns; i++) {
        if (S[i] < t && t < S[i + 1] && !src.poly(i)) {
          const d = 1e-9 * Math.max(1, Math.abs(t));
          if (steep(i, t, 0) || steep(i, t, -d) || steep(i, t, d)) out.push(t);
        }
      }
    }
  }
  return [...new Set(out)].sort((x, y) => x - y);
}

/**
 * A uniform entry's slope at t: the mean of the one-sided slopes when `br` is a break exactly at t (with a
 * right segment), else the segment's slope (0 outside [S₀, S_N)); the last entry takes the last segment's
 * slope. Each is made finite by finiteSlope, with the secant over ⅛ of the grid step `step`: for f ≈ c·√u
 * (circ, a bezier handle with dx/ds = 0) the Hermite interval [0, H] with m0 = c/√(H/8) ≈ 2.8·(secant
 * over H) is within a few % of the best m0 (max error ≈ 0.105·c·√H against 0.23·c·√H with the plain
 * secant; measured by dense sampling).
 */
export function entrySlope(src: BakeSource, t: number, seg: number, br: Break | null, last: boolean, lastSegment: number, step: number): number {
  const S = src.times;
  const w = 0.125 * step;
  if (last) {
    const te = Math.min(t, S[S.length - 1]);
    return finiteSlope(src, lastSegment, te, -1, src.value(lastSegment, te, 1), w);
  }
  if (br) return 0.5 * (finiteSlope(src, br.left, t, -1, src.value(br.left, t, 1), w) + finiteSlope(src, br.right, t, 1, src.value(br.right, t, 1), w));
  return seg >= 0 ? finiteSlope(src, seg, t, 1, src.value(seg, t, 1), w) : 0;
}
