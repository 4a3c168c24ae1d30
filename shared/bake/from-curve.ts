/**
 * Adapter from the curve engine (../curve) to the baker's BakeSource. Segment polynomials are computed
 * once here (segmentPolynomial allocates); values, derivatives and derivative bounds call the engine.
 */
import { curveBreaks, prepareCurve, segmentDerivativeBound, segmentPolynomial, segmentValue, SEGMENT_KINDS, type CurveDocument, type PreparedCurve } from '../curve';
import type { BakeSource } from './source';

// The hot evaluators held in module constants: once bundled to CommonJS (tsx, the server build) every
// call through an imported binding is a getter call on the module's exports (two through an index file).
const valueOf = segmentValue;
const boundOf = segmentDerivativeBound;

export function sourceFromPrepared(c: PreparedCurve, name = c.doc.name): BakeSource {
  const n = c.count - 1;
  const polys: (Float64Array | null)[] = [];
  for (let i = 0; i < n; i++) polys.push(segmentPolynomial(c, i));
  // breaks strictly inside a segment (shape joints, bezier vertical tangents); key breaks are found by ./breaks
  const inner = curveBreaks(c).filter((b) => {
    for (let i = 0; i < n; i++) if (c.times[i] < b.time && b.time < c.times[i + 1]) return true;
    return false;
  });
  const cuts = Float64Array.from(inner, (b) => b.time);
  const cutOrders = Uint8Array.from(inner, (b) => Math.min(b.order, 255));
  return {
    name,
    times: c.times,
    kinds: Array.from(c.kinds, (k) => SEGMENT_KINDS[k]),
    value: (i, t, order) => valueOf(c, i, t, order as 0 | 1 | 2 | 3 | 4),
    poly: (i) => polys[i],
    bound: (i, order, ta, tb) => boundOf(c, i, order as 1 | 2 | 3 | 4, ta, tb),
    endValue: c.values[c.count - 1],
    cuts,
    cutOrders,
  };
}

export function sourceFromDocument(doc: CurveDocument): BakeSource {
  return sourceFromPrepared(prepareCurve(doc));
}
