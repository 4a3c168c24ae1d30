/**
 * Small test sources built without the curve engine: piecewise cubic Hermite / linear / step keys
 * (glTF 2.0 Appendix C formula) and smooth functions with known derivatives (for the sampled path).
 */
import type { BakeSource } from '../../../shared/bake/source';
import type { SegmentKind } from '../../../shared/curve/types';

export interface TestKey { t: number; v: number; mIn?: number; mOut?: number }

/** Keys joined by step/linear/hermite segments; a repeated time is a jump. */
export function polySource(name: string, keys: TestKey[], kinds: SegmentKind[]): BakeSource {
  const n = keys.length - 1;
  const times = Float64Array.from(keys.map((k) => k.t));
  const polys: Float64Array[] = [];
  for (let i = 0; i < n; i++) {
    const a = keys[i], b = keys[i + 1];
    const h = b.t - a.t;
    const c = new Float64Array(4);
    if (h === 0 || kinds[i] === 'step') c[0] = h === 0 ? b.v : a.v;
    else if (kinds[i] === 'linear') { c[0] = a.v; c[1] = (b.v - a.v) / h; }
    else {
      const m0 = a.mOut ?? 0, m1 = b.mIn ?? 0, d = (b.v - a.v) / h;
      c[0] = a.v; c[1] = m0; c[2] = (3 * d - 2 * m0 - m1) / h; c[3] = (m0 + m1 - 2 * d) / (h * h);
    }
    polys.push(c);
  }
  const value = (i: number, t: number, order: number): number => {
    const c = polys[i];
    const u = t - times[i];
    switch (order) {
      case 0: return c[0] + u * (c[1] + u * (c[2] + u * c[3]));
      case 1: return c[1] + u * (2 * c[2] + 3 * u * c[3]);
      case 2: return 2 * c[2] + 6 * u * c[3];
      case 3: return 6 * c[3];
      default: return 0;
    }
  };
  const bound = (i: number, order: number, ta: number, tb: number): number =>
    Math.max(Math.abs(value(i, ta, order)), Math.abs(value(i, tb, order)));
  return { name, times, kinds, value, poly: (i) => polys[i], bound, endValue: keys[n].v };
}

/** One smooth segment f on [a, b] with derivatives f(t, order) and |f^(order)| ≤ M(order) (kind 'shape'). */
export function fnSource(name: string, a: number, b: number, f: (t: number, order: number) => number, M: (order: number) => number): BakeSource {
  return {
    name, times: Float64Array.of(a, b), kinds: ['shape'],
    value: (_i, t, order) => f(t, order), poly: () => null, bound: (_i, order) => M(order), endValue: f(b, 0),
  };
}

/** sin and its derivatives: sin^(k)(t) = sin(t + kπ/2). */
export const sinFn = (t: number, order: number): number => Math.sin(t + (order * Math.PI) / 2);
