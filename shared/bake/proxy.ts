/**
 * Cubic stand-ins for the source segments that are not polynomials (bezier, shapes), each with a proven
 * distance to the source, so that the error of a table there is measured like a polynomial's.
 *
 * A sampled segment is cut at its inner cuts, then into leaves [a, b] of width h. On a leaf, q is the
 * cubic through the source at the four equally spaced nodes a, a + h/3, a + 2h/3, b. The remainder of
 * polynomial interpolation (Burden & Faires, Numerical Analysis, Thm 3.3, from memory) is
 *   f(t) − q(t) = f⁽⁴⁾(ξ)/4! · w(t),  w(t) = (t − a)(t − a − h/3)(t − a − 2h/3)(t − b),
 * and max |w| over [a, b] is h⁴/81 (with y = t − (a+b)/2 and z = y², w = (z − h²/4)(z − h²/36), whose
 * extreme on z ∈ [0, h²/4] is −h⁴/81 at z = 5h²/36). So with M4 = max |f⁽⁴⁾| on the leaf
 *   |f − q| ≤ M4·h⁴/1944,
 * which tests/unit/bake/proxy.test.ts checks on f = t⁴ (the bound is attained there). Each leaf keeps its
 * own figure ε = M4·h⁴/1944 + a rounding margin. For any table p, on the leaf
 *   |q − p| − ε ≤ |f − p| ≤ |q − p| + ε,
 * and |q − p| is a cubic's maximum, computed exactly (./poly.ts maxAbsCubic).
 *
 * Leaves are made by halving from the whole piece until the bound allows the piece to be cut into at most
 * 8 equal leaves within the target ε (graded toward a point where f⁽⁴⁾ grows without bound). A piece that
 * still has no finite bound at depth MAX_DEPTH (a sliver of 2⁻⁴⁰ of the piece next to a vertical tangent
 * or a joint) becomes a constant leaf: with a finite slope bound M1, q = f(a) and ε = M1·h (mean value
 * theorem); with none (a vertical tangent), q = (f(a) + f(b))/2 and ε = |f(b) − f(a)|/2, taking the source
 * as monotone on the sliver (as ./measure.ts sliver does). Once the leaf budget is used up, the rest of a
 * segment stays `sampled`: ./measure.ts samples the source there with the second-derivative slack.
 */
import type { BakeSource } from './source';

/** Halvings of a piece before a piece with no usable bound is left to sampling. */
const MAX_DEPTH = 40;
/** Leaves per source segment before the rest is left to sampling. */
const MAX_LEAVES = 4096;
/** Equal leaves one bound may be spread over before the piece is halved instead. */
const SPREAD = 8;

export interface Proxy {
  /** The target distance the leaves were built for. */
  eps: number;
  /** Leaves of segment i are [first[i], first[i + 1]) (none for polynomial and empty segments). */
  first: Int32Array;
  /** Leaf k: start a[k], end b[k], power coefficients c[4k..4k+3] in u = t − a[k], proven distance err[k]. */
  a: Float64Array;
  b: Float64Array;
  c: Float64Array;
  err: Float64Array;
  /** Leaf kind: CUBIC, CONSTANT (a sliver: entries there take the source's own values) or SAMPLED (no stand-in: c and err unused). */
  kind: Uint8Array;
}

export const CUBIC = 0, CONSTANT = 1, SAMPLED = 2;

const CACHE = new WeakMap<BakeSource, Proxy[]>();
/** Proxies kept per source (one per tolerance in use; a bake uses one or two). */
const KEEP = 4;

/** The proxy of `src` for distance `eps` (built once per source and eps, then reused). */
export function proxyFor(src: BakeSource, eps: number): Proxy {
  let list = CACHE.get(src);
  if (!list) { list = []; CACHE.set(src, list); }
  for (const p of list) if (p.eps === eps) return p;
  const p = buildProxy(src, eps);
  list.unshift(p);
  if (list.length > KEEP) list.length = KEEP;
  return p;
}

/** Whether any non-empty segment of `src` is not a polynomial (the proxy then has leaves). */
export function hasSampledSegments(src: BakeSource): boolean {
  const S = src.times;
  for (let i = 0; i + 1 < S.length; i++) if (S[i + 1] > S[i] && !src.poly(i)) return true;
  return false;
}

/** Growing leaf storage while building. */
class Leaves {
  n = 0;
  a = new Float64Array(64); b = new Float64Array(64); c = new Float64Array(256); err = new Float64Array(64);
  kind = new Uint8Array(64);
  grow(): void {
    const m = this.a.length * 2;
    const g = (x: Float64Array, k: number) => { const y = new Float64Array(m * k); y.set(x); return y; };
    this.a = g(this.a, 1); this.b = g(this.b, 1); this.c = g(this.c, 4); this.err = g(this.err, 1);
    const s = new Uint8Array(m); s.set(this.kind); this.kind = s;
  }
  push(a: number, b: number, kind: number): number {
    if (this.n === this.a.length) this.grow();
    const k = this.n++;
    this.a[k] = a; this.b[k] = b; this.kind[k] = kind; this.err[k] = 0;
    this.c[4 * k] = 0; this.c[4 * k + 1] = 0; this.c[4 * k + 2] = 0; this.c[4 * k + 3] = 0;
    return k;
  }
}

/** The last leaf end evaluated while building (segment, time, value). */
let lastSeg = -1, lastT = Number.NaN, lastV = 0;

/** The cubic through f at a, a + h/3, a + 2h/3, b (Newton's divided differences, then power form in u = t − a). */
function interpolate(src: BakeSource, i: number, a: number, b: number, L: Leaves, k: number, M4: number): void {
  const h = b - a, d = h / 3;
  // a leaf starts where the previous one of the segment ended (the same double): its end value is reused
  const f0 = i === lastSeg && a === lastT ? lastV : src.value(i, a, 0);
  const f1 = src.value(i, a + d, 0), f2 = src.value(i, a + 2 * d, 0), f3 = src.value(i, b, 0);
  lastSeg = i; lastT = b; lastV = f3;
  const D1 = (f1 - f0) / d;
  const D2 = (f2 - 2 * f1 + f0) / (2 * d * d);
  const D3 = (f3 - 3 * f2 + 3 * f1 - f0) / (6 * d * d * d);
  // q(u) = f0 + D1·u + D2·u(u − d) + D3·u(u − d)(u − 2d)
  const o = 4 * k;
  L.c[o] = f0;
  L.c[o + 1] = D1 - d * D2 + 2 * d * d * D3;
  L.c[o + 2] = D2 - 3 * d * D3;
  L.c[o + 3] = D3;
  // rounding margin: the source evaluations (≤ 1e-12 of the magnitudes for bezier, far less for shapes) and the
  // differences and their expansion in doubles (a few ulps of the magnitudes), inflated to 1e-9
  const mag = Math.abs(f0) + Math.abs(f1) + Math.abs(f2) + Math.abs(f3);
  const rem = (M4 * h * h * h * h) / 1944;
  const e = rem + 1e-9 * mag + 1e-300;
  const finite = Number.isFinite(L.c[o] + L.c[o + 1] + L.c[o + 2] + L.c[o + 3]) && Number.isFinite(e);
  if (!finite) { L.kind[k] = SAMPLED; return; }
  L.err[k] = e;
}

/** A constant leaf on a sliver [a, b] (see the top); SAMPLED when even that has no finite figure. */
function constant(src: BakeSource, i: number, a: number, b: number, L: Leaves): void {
  const k = L.push(a, b, CONSTANT);
  const fa = src.value(i, a, 0), fb = src.value(i, b, 0);
  const M1 = src.bound(i, 1, a, b);
  let q: number, e: number;
  if (Number.isFinite(M1)) { q = fa; e = M1 * (b - a); } else { q = 0.5 * (fa + fb); e = 0.5 * Math.abs(fb - fa); }
  e += 1e-9 * (Math.abs(fa) + Math.abs(fb)) + 1e-300;
  if (!(Number.isFinite(q) && Number.isFinite(e))) { L.kind[k] = SAMPLED; return; }
  L.c[4 * k] = q;
  L.err[k] = e;
}

function buildProxy(src: BakeSource, eps: number): Proxy {
  lastSeg = -1;
  const S = src.times, ns = S.length - 1;
  const first = new Int32Array(ns + 1);
  const L = new Leaves();
  const cuts = src.cuts;
  let c = 0;
  for (let i = 0; i < ns; i++) {
    first[i] = L.n;
    const s0 = S[i], s1 = S[i + 1];
    if (!(s1 > s0) || src.poly(i)) continue;
    const budgetEnd = L.n + MAX_LEAVES;
    // pieces between the inner cuts of this segment
    while (cuts && c < cuts.length && cuts[c] <= s0) c++;
    let x = s0;
    for (;;) {
      const y = cuts && c < cuts.length && cuts[c] < s1 ? cuts[c++] : s1;
      if (y > x) split(src, i, x, y, 0, eps, L, budgetEnd);
      if (y >= s1) break;
      x = y;
    }
  }
  first[ns] = L.n;
  const n = L.n;
  return { eps, first, a: L.a.slice(0, n), b: L.b.slice(0, n), c: L.c.slice(0, 4 * n), err: L.err.slice(0, n), kind: L.kind.slice(0, n) };
}

/** Leaves for [x, y] inside segment i (recursive halving; see the top). */
function split(src: BakeSource, i: number, x: number, y: number, depth: number, eps: number, L: Leaves, budgetEnd: number): void {
  const h = y - x;
  const M4 = src.bound(i, 4, x, y);
  // the number of equal leaves the bound over [x, y] needs for eps (margin: half of eps is kept for rounding)
  const need = Number.isFinite(M4) ? (M4 === 0 ? 1 : Math.ceil(h * Math.pow((1944 * 0.5 * eps) / M4, -0.25))) : Infinity;
  if (need <= SPREAD && L.n + need <= budgetEnd) {
    const w = h / need;
    for (let j = 0; j < need; j++) {
      const a = j === 0 ? x : x + j * w, b = j === need - 1 ? y : x + (j + 1) * w;
      const k = L.push(a, b, CUBIC);
      interpolate(src, i, a, b, L, k, need === 1 ? M4 : src.bound(i, 4, a, b));
    }
    return;
  }
  const mid = x + h / 2;
  if (L.n + 2 > budgetEnd) { L.push(x, y, SAMPLED); return; }
  if (depth >= MAX_DEPTH || !(mid > x && mid < y)) { constant(src, i, x, y, L); return; }
  split(src, i, x, mid, depth + 1, eps, L, budgetEnd);
  split(src, i, mid, y, depth + 1, eps, L, budgetEnd);
}
