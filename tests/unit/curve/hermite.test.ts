import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  evaluate, evaluateDerivative, prepareCurve, segmentDerivativeBound, segmentPolynomial, segmentValue, shapeDerivativeBound, shapeValue,
} from '../../../shared/curve';
import { linspace, makeDoc } from './helpers';

/** glTF 2.0 Appendix C cubic spline, written out as the spec (REFERENCES.md) gives it. */
function gltfCubic(tk: number, tk1: number, vk: number, bk: number, vk1: number, ak1: number, t: number): number {
  const td = tk1 - tk;
  const s = (t - tk) / td;
  return (2 * s ** 3 - 3 * s ** 2 + 1) * vk + td * (s ** 3 - 2 * s ** 2 + s) * bk + (-2 * s ** 3 + 3 * s ** 2) * vk1 + td * (s ** 3 - s ** 2) * ak1;
}

describe('hermite segments follow glTF 2.0 Appendix C', () => {
  it('property: evaluate equals the spec formula (tangents per second) to 1e-12 relative', () => {
    fc.assert(fc.property(
      fc.double({ min: -100, max: 100, noNaN: true }), fc.double({ min: 0.01, max: 10, noNaN: true }),
      fc.array(fc.double({ min: -50, max: 50, noNaN: true }), { minLength: 4, maxLength: 4 }),
      fc.double({ min: 0, max: 1, noNaN: true }),
      (t0, h, [v0, b0, v1, a1], s) => {
        const c = prepareCurve(makeDoc([
          { time: t0, value: v0, slopeIn: 0, slopeOut: b0, slopes: 'split' },
          { time: t0 + h, value: v1, slopeIn: a1, slopeOut: 0, slopes: 'split' },
        ]));
        const t = Math.min(t0 + s * h, c.end);
        const ref = gltfCubic(t0, c.end, v0, b0, v1, a1, t);
        const got = segmentValue(c, 0, t);
        return Math.abs(got - ref) <= 1e-12 * (1 + Math.abs(v0) + Math.abs(v1) + h * (Math.abs(b0) + Math.abs(a1)));
      },
    ), { numRuns: 300 });
  });
  it('tabulated values: keys (1, 2, slope 3) → (3, −1, slope 0.5)', () => {
    const c = prepareCurve(makeDoc([{ time: 1, value: 2, slopeOut: 3, slopeIn: 3 }, { time: 3, value: -1, slopeIn: 0.5, slopeOut: 0.5 }]));
    for (const t of [1, 1.5, 2, 2.5, 2.999]) expect(evaluate(c, t)).toBeCloseTo(gltfCubic(1, 3, 2, 3, -1, 0.5, t), 13);
    expect(evaluate(c, 3)).toBe(-1); // end exact
    expect(evaluateDerivative(c, 1, 1)).toBeCloseTo(3, 13); // matches the out-slope
    expect(segmentValue(c, 0, 3, 1)).toBeCloseTo(0.5, 12); // left limit of the slope = in-slope
  });
  it('segmentPolynomial is the exact power basis: Horner of [c0..c3] reproduces the spec formula', () => {
    const c = prepareCurve(makeDoc([{ time: 0.5, value: 1, slopeOut: -2 }, { time: 1.25, value: 4, slopeIn: 7 }]));
    const p = segmentPolynomial(c, 0)!;
    expect(p).toHaveLength(4);
    for (const t of linspace(0.5, 1.25, 10)) {
      const u = t - 0.5;
      expect(p[0] + u * (p[1] + u * (p[2] + u * p[3]))).toBeCloseTo(gltfCubic(0.5, 1.25, 1, -2, 4, 7, t), 12);
    }
    const step = prepareCurve(makeDoc([{ time: 0, value: 3 }, { time: 1, value: 4 }], 'step'));
    expect(Array.from(segmentPolynomial(step, 0)!)).toEqual([3, 0, 0, 0]);
    const lin = prepareCurve(makeDoc([{ time: 0, value: 3 }, { time: 2, value: 4 }], 'linear'));
    expect(Array.from(segmentPolynomial(lin, 0)!)).toEqual([3, 0.5, 0, 0]);
  });
  it('segmentDerivativeBound is the exact max for polynomial segments', () => {
    const c = prepareCurve(makeDoc([{ time: 0, value: 0, slopeOut: 5 }, { time: 2, value: 1, slopeIn: -4 }]));
    for (const k of [1, 2, 3] as const) {
      for (const [a, b] of [[0, 2], [0.3, 1.1], [1.5, 1.9]]) {
        let m = 0;
        for (const t of linspace(a, b, 20000)) m = Math.max(m, Math.abs(segmentValue(c, 0, t, k)));
        const bound = segmentDerivativeBound(c, 0, k, a, b);
        expect(bound).toBeGreaterThanOrEqual(m);
        expect(bound).toBeLessThanOrEqual(m * (1 + 1e-7));
      }
    }
    expect(segmentDerivativeBound(c, 0, 4, 0, 2)).toBe(0);
  });
});

// Interpolation error facts (REFERENCES.md; textbook, from memory: Burden & Faires §3.4, de Boor).
describe('interpolation error facts', () => {
  it('max θ²(1−θ)² on [0,1] is 1/16 at θ = ½: the hermite error of t⁴ with exact slopes on [0, 1]', () => {
    // f − p = f''''/4!·θ²(θ−1)² = θ²(1−θ)² for f = t⁴ (f'''' = 24), keys (0,0,slope 0) and (1,1,slope 4).
    const c = prepareCurve(makeDoc([{ time: 0, value: 0, slopeOut: 0 }, { time: 1, value: 1, slopeIn: 4 }]));
    let worst = 0, at = 0;
    for (const t of linspace(0, 1, 10000)) {
      const e = Math.abs(t ** 4 - evaluate(c, t));
      if (e > worst) { worst = e; at = t; }
    }
    expect(worst).toBeCloseTo(1 / 16, 14);
    expect(at).toBe(0.5);
  });

  function sinTable(nodes: number[], kind: 'hermite' | 'linear') {
    return prepareCurve(makeDoc(nodes.map((t) => ({ time: t, value: Math.sin(t), slopeIn: Math.cos(t), slopeOut: Math.cos(t) })), kind));
  }
  function maxError(c: ReturnType<typeof prepareCurve>, f: (t: number) => number, a: number, b: number) {
    let m = 0;
    for (const t of linspace(a, b, 48 * 400)) m = Math.max(m, Math.abs(f(t) - evaluate(c, t)));
    return m;
  }

  it('sin on [0, π/2], h = π/48: hermite bound M4·h⁴/384 = 4.78e-8 and actual 4.78e-8', () => {
    const h = Math.PI / 48;
    const c = sinTable(linspace(0, Math.PI / 2, 24), 'hermite');
    const bound = (1 * h ** 4) / 384; // M4 = max |sin| = 1
    expect(bound).toBeCloseTo(4.78e-8, 10);
    const err = maxError(c, Math.sin, 0, Math.PI / 2);
    expect(err).toBeLessThanOrEqual(bound);
    expect(err / 4.78e-8).toBeCloseTo(1, 2);
  });
  it('sin with nodes 0, π/6, π/3: bound 1.96e-4, actual 1.38e-4', () => {
    const c = sinTable([0, Math.PI / 6, Math.PI / 3], 'hermite');
    const bound = (Math.PI / 6) ** 4 / 384;
    expect(bound).toBeCloseTo(1.96e-4, 6);
    const err = maxError(c, Math.sin, 0, Math.PI / 3);
    expect(err).toBeCloseTo(1.38e-4, 6);
  });
  it('linear, h = π/48: bound M2·h²/8 = 5.35e-4 and actual 5.35e-4', () => {
    const h = Math.PI / 48;
    const c = sinTable(linspace(0, Math.PI / 2, 24), 'linear');
    const bound = h ** 2 / 8;
    expect(bound).toBeCloseTo(5.35e-4, 6);
    const err = maxError(c, Math.sin, 0, Math.PI / 2);
    expect(err).toBeLessThanOrEqual(bound);
    expect(err / 5.35e-4).toBeCloseTo(1, 2);
  });
  for (const [n, bnd, act] of [[4, 4.95e-4, 4.53e-4], [8, 3.10e-5, 3.03e-5]] as const) {
    it(`sinInOut with exact slopes, n = ${n}: bound ${bnd}, actual ${act} (M4 from shapeDerivativeBound)`, () => {
      const shape = { family: 'sine', ease: 'in-out' } as const;
      const nodes = linspace(0, 1, n);
      const c = prepareCurve(makeDoc(nodes.map((t) => ({ time: t, value: shapeValue(shape, t), slopeIn: shapeValue(shape, t, 1), slopeOut: shapeValue(shape, t, 1) }))));
      const M4 = shapeDerivativeBound(shape, 4, 0, 1);
      const bound = (M4 * (1 / n) ** 4) / 384;
      expect(bound).toBeCloseTo(bnd, n === 4 ? 6 : 7);
      const err = maxError(c, (t) => shapeValue(shape, t), 0, 1);
      expect(err).toBeLessThanOrEqual(bound);
      expect(err / act).toBeCloseTo(1, 2);
    });
  }
});
