import { describe, expect, it } from 'vitest';
import { easeBackOut } from 'd3-ease';
import { evaluate, parseCurveDocument, prepareCurve } from '../../../shared/curve';
import { fitCurve } from '../../../shared/convert';
import { EDITOR_EXAMPLES } from '../../../src/features/editor/store/examples';
import { sparkline } from '../../../src/features/editor/key-card/shape-palette';
import { patchSegment } from '../../../src/features/editor/store/edits';

const button = EDITOR_EXAMPLES.find((e) => e.id === 'menu-transitions/button-press-scale')!.doc;

describe('shape palette and conversion to keys', () => {
  it('the example release segment is d3-ease backOut (s = 1.70158)', () => {
    // d3-ease 3.0.2 backOut, REFERENCES.md: the shape family the palette previews
    const c = prepareCurve(button);
    const t0 = button.keys[1].time, t1 = button.keys[2].time, v0 = button.keys[1].value, v1 = button.keys[2].value;
    for (const s of [0.1, 0.3, 0.5, 0.9]) expect(evaluate(c, t0 + s * (t1 - t0))).toBeCloseTo(v0 + (v1 - v0) * easeBackOut(s), 12);
  });

  it('backOut is a cubic, so one hermite segment holds it exactly (no key added)', () => {
    // d3-ease backOut: 1 + (s + 1)(t − 1)³ + s(t − 1)² is a polynomial of degree 3
    const r = fitCurve(prepareCurve(button), 5e-4, [1]);
    expect(r.ok).toBe(true);
    expect(r.keysAdded).toBe(0);
    expect(r.maxError).toBeLessThan(1e-6);
  });

  it('converting an elastic shape gives hermite keys within the tolerance, checked by sampling both curves', () => {
    const tol = 5e-4;
    const elastic = patchSegment(button, 1, { kind: 'shape', shape: { family: 'elastic', ease: 'out' } });
    const r = fitCurve(prepareCurve(elastic), tol, [1]);
    expect(r.ok).toBe(true);
    expect(r.keysAdded).toBeGreaterThan(0);
    expect(parseCurveDocument(r.doc).ok).toBe(true);
    expect(r.doc.segments.every((s) => s.kind === 'hermite')).toBe(true);
    const a = prepareCurve(elastic), b = prepareCurve(r.doc);
    let worst = 0;
    for (let k = 0; k <= 4000; k++) {
      const t = (k / 4000) * 0.4;
      worst = Math.max(worst, Math.abs(evaluate(a, t) - evaluate(b, t)));
    }
    expect(worst).toBeLessThanOrEqual(tol);
  });

  it('a sparkline spans its box and shows overshoot', () => {
    const d = sparkline({ family: 'back', ease: 'out' }, 0.32);
    const ys = [...d.matchAll(/,(-?[\d.]+)/g)].map((m) => Number(m[1]));
    expect(Math.min(...ys)).toBeCloseTo(2, 6); // the overshoot peak reaches the top margin
    expect(ys[0]).toBeGreaterThan(ys[ys.length - 1]); // starts low, ends high (screen y grows down)
  });
});
