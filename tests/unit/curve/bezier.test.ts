import bezierEasing from 'bezier-easing';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  bernstein, bezierEase, bezierEaseBound, bezierSolve, evaluate, evaluateDerivative, prepareCurve, segmentDerivativeBound,
} from '../../../shared/curve';
import { linspace, makeDoc } from './helpers';

/**
 * The bound as it was written before its coefficients were hoisted (bernstein() per figure), kept as the
 * reference the hoisted one must equal number for number (the baker's stand-ins and outputs depend on it).
 */
/** max |P^(k)| over s ∈ [a, b] for the Bernstein cubic (k = 1 quadratic, 2 linear, 3 constant). */
function maxAbsDerivative(p0: number, p1: number, p2: number, p3: number, k: number, a: number, b: number): number {
  let m = Math.max(Math.abs(bernstein(p0, p1, p2, p3, a, k)), Math.abs(bernstein(p0, p1, p2, p3, b, k)));
  if (k === 1) {
    const bb = 3 * (p2 - 2 * p1 + p0);
    const aa = p3 - p0 - 3 * (p1 - p0) - bb;
    if (aa !== 0) {
      const v = -bb / (3 * aa);
      if (v > a && v < b) m = Math.max(m, Math.abs(bernstein(p0, p1, p2, p3, v, 1)));
    }
  }
  return m;
}

/** min x'(s) over [a, b] (x' is a quadratic: ends and vertex). */
function minXSpeed(x1: number, x2: number, a: number, b: number): number {
  let m = Math.min(bernstein(0, x1, x2, 1, a, 1), bernstein(0, x1, x2, 1, b, 1));
  const bb = 3 * (x2 - 2 * x1);
  const aa = 1 - 3 * x1 - bb;
  if (aa !== 0) {
    const v = -bb / (3 * aa);
    if (v > a && v < b) m = Math.min(m, bernstein(0, x1, x2, 1, v, 1));
  }
  return m;
}

function referenceBound(x1: number, x2: number, y0: number, y1: number, y2: number, y3: number, order: number, Xa: number, Xb: number): number {
  const sa = Math.max(0, bezierSolve(0, x1, x2, 1, Math.min(Xa, Xb)) - 1e-12);
  const sb = Math.min(1, bezierSolve(0, x1, x2, 1, Math.max(Xa, Xb)) + 1e-12);
  const xmin = minXSpeed(x1, x2, sa, sb);
  if (!(xmin > 0)) return Infinity;
  const X1 = maxAbsDerivative(0, x1, x2, 1, 1, sa, sb);
  const X2 = maxAbsDerivative(0, x1, x2, 1, 2, sa, sb);
  const X3 = maxAbsDerivative(0, x1, x2, 1, 3, sa, sb);
  const Y1 = maxAbsDerivative(y0, y1, y2, y3, 1, sa, sb);
  const Y2 = maxAbsDerivative(y0, y1, y2, y3, 2, sa, sb);
  const Y3 = maxAbsDerivative(y0, y1, y2, y3, 3, sa, sb);
  const N = Y2 * X1 + Y1 * X2;
  const N1 = Y3 * X1 + Y1 * X3;
  const N2 = Y3 * X2 + Y2 * X3;
  const M = N1 * X1 + 3 * N * X2;
  const M1 = N2 * X1 + 2 * N1 * X2 + 3 * N * X3;
  let r: number;
  switch (order) {
    case 1: r = Y1 / xmin; break;
    case 2: r = N / xmin ** 3; break;
    case 3: r = M / xmin ** 5; break;
    default: r = (M1 * X1 + 5 * M * X2) / xmin ** 7;
  }
  return r * (1 + 1e-12);
}

// W3C CSS Easing Functions Level 1 keyword control points (REFERENCES.md).
const KEYWORDS: Record<string, [number, number, number, number]> = {
  ease: [0.25, 0.1, 0.25, 1],
  'ease-in': [0.42, 0, 1, 1],
  'ease-out': [0, 0, 0.58, 1],
  'ease-in-out': [0.42, 0, 0.58, 1],
};
const css = (p: [number, number, number, number], x: number, order = 0) => bezierEase(p[0], p[2], 0, p[1], p[3], 1, x, order);

describe('CSS cubic-bezier semantics', () => {
  for (const [name, p] of Object.entries(KEYWORDS)) {
    it(`${name} agrees with bezier-easing 3.2.0 inside [0, 1]`, () => {
      const ref = bezierEasing(...p); // bezier-easing 3.2.0 (npm), exact solver; compare inside [0,1] only
      for (const x of linspace(0, 1, 500)) expect(Math.abs(css(p, x) - ref(x))).toBeLessThanOrEqual(1e-12);
    });
  }
  it('REFERENCES.md exact values: ease 0.408511 / 0.802403 / 0.960459, ease-in-out 0.129162 / 0.5 / 0.870838', () => {
    const e = KEYWORDS.ease, io = KEYWORDS['ease-in-out'];
    expect(css(e, 0.25)).toBeCloseTo(0.408511, 6);
    expect(css(e, 0.5)).toBeCloseTo(0.802403, 6);
    expect(css(e, 0.75)).toBeCloseTo(0.960459, 6);
    expect(css(io, 0.25)).toBeCloseTo(0.129162, 6);
    expect(css(io, 0.5)).toBeCloseTo(0.5, 12);
    expect(css(io, 0.75)).toBeCloseTo(0.870838, 6);
  });
  it('extend beyond a bezier segment follows the CSS Easing extension: ease(−0.5) = −0.2, ease(1.5) = 1 (REFERENCES.md)', () => {
    const p = KEYWORDS.ease;
    const doc = makeDoc([{ time: 0, value: 0 }, { time: 1, value: 1 }],
      [{ kind: 'bezier', bezier: { h1: { time: p[0], value: p[1] }, h2: { time: p[2], value: p[3] } } }],
      { before: 'extend', after: 'extend' });
    const c = prepareCurve(doc);
    expect(evaluate(c, -0.5)).toBeCloseTo(-0.2, 12);
    expect(evaluate(c, 1.5)).toBeCloseTo(1, 12);
  });
});

describe('bezierSolve', () => {
  it('solves x(s) = t to the last bits, also for near-vertical handles (x1 = 1e-9, x2 = 1 − 1e-9)', () => {
    for (const [x1, x2] of [[0.25, 0.25], [1e-9, 1 - 1e-9], [0, 1], [1, 0], [0.999999, 0.000001]]) {
      for (const t of linspace(0, 1, 300)) {
        const s = bezierSolve(0, x1, x2, 1, t);
        expect(Math.abs(bernstein(0, x1, x2, 1, s, 0) - t)).toBeLessThanOrEqual(1e-15); // a few ulps of x near 1
      }
    }
  });
  it('value agrees to 1e-12 with a pure-bisection reference (independent method) on near-vertical handles', () => {
    // Handles almost vertical at the ends: cubic-bezier(1e-9, 1, 1 − 1e-9, 0), (0, 1, 1, 0), (1e-7, −3, 0.5, 4).
    for (const [x1, y1, x2, y2] of [[1e-9, 1, 1 - 1e-9, 0], [0, 1, 1, 0], [1e-7, -3, 0.5, 4], [1e-9, 1, 0.3, 1]]) {
      // end points are exact: y(0) = y0, y(1) = y3
      expect(bezierEase(x1, x2, 0, y1, y2, 1, 0, 0)).toBe(0);
      expect(bezierEase(x1, x2, 0, y1, y2, 1, 1, 0)).toBe(1);
      // inside, bisection (200 halvings) is the independent reference
      for (const X of linspace(0, 1, 200).slice(1, -1)) {
        let lo = 0, hi = 1;
        for (let j = 0; j < 200; j++) {
          const m = 0.5 * (lo + hi);
          if (bernstein(0, x1, x2, 1, m, 0) < X) lo = m; else hi = m;
        }
        const ref = bernstein(0, y1, y2, 1, 0.5 * (lo + hi), 0);
        expect(Math.abs(bezierEase(x1, x2, 0, y1, y2, 1, X, 0) - ref)).toBeLessThanOrEqual(1e-12);
      }
    }
  });
});

describe('bezier derivatives (chain rule) and their bound', () => {
  const cases: [number, number, number, number, number, number][] = [
    [0.25, 0.25, 0, 0.1, 1, 1], [0.42, 0.58, 0, 0, 1, 1], [0.3, 0.9, 2, -1, 3, 0.5], [0.05, 0.6, 0, 2, -1, 1],
  ];
  it('orders 1..4 agree with central differences of the exact lower order', () => {
    const h = 1e-5;
    for (const [x1, x2, y0, y1, y2, y3] of cases) {
      for (const X of linspace(0.02, 0.98, 60)) {
        for (const k of [1, 2, 3, 4]) {
          const fd = (bezierEase(x1, x2, y0, y1, y2, y3, X + h, k - 1) - bezierEase(x1, x2, y0, y1, y2, y3, X - h, k - 1)) / (2 * h);
          const exact = bezierEase(x1, x2, y0, y1, y2, y3, X, k);
          expect(Math.abs(fd - exact) / Math.max(1, Math.abs(exact))).toBeLessThan(1e-4);
        }
      }
    }
  });
  it('the bound is the same number as the reference written with bernstein() per figure (fast-check)', () => {
    const unit = fc.oneof(fc.double({ min: 0, max: 1, noNaN: true }), fc.constantFrom(0, 1, 0.5, 1 / 3, 2 / 3, 1e-9, 1 - 1e-9));
    const val = fc.oneof(fc.double({ min: -2, max: 3, noNaN: true }), fc.constantFrom(0, 1, 0.5));
    fc.assert(fc.property(unit, unit, val, val, val, val, fc.integer({ min: 1, max: 4 }), unit, unit, (x1, x2, y0, y1, y2, y3, k, a, b) => {
      expect(Object.is(bezierEaseBound(x1, x2, y0, y1, y2, y3, k, a, b), referenceBound(x1, x2, y0, y1, y2, y3, k, a, b))).toBe(true);
    }), { numRuns: 5000 });
    for (const [x1, x2, y0, y1, y2, y3] of cases) for (const k of [1, 2, 3, 4]) for (const [a, b] of [[0, 1], [0.1, 0.3], [0.5, 0.9], [0, 0.5]]) {
      expect(Object.is(bezierEaseBound(x1, x2, y0, y1, y2, y3, k, a, b), referenceBound(x1, x2, y0, y1, y2, y3, k, a, b))).toBe(true);
    }
  });
  it('the bound never falls below sampled |d^k y/dX^k|, and is Infinity at a vertical tangent', () => {
    for (const [x1, x2, y0, y1, y2, y3] of cases) {
      for (const [a, b] of [[0, 1], [0.1, 0.3], [0.5, 0.9]]) {
        for (const k of [1, 2, 3, 4]) {
          let m = 0;
          for (const X of linspace(a, b, 300)) m = Math.max(m, Math.abs(bezierEase(x1, x2, y0, y1, y2, y3, X, k)));
          expect(bezierEaseBound(x1, x2, y0, y1, y2, y3, k, a, b)).toBeGreaterThanOrEqual(m);
        }
      }
    }
    expect(bezierEaseBound(0, 1, 0, 0.5, 0.5, 1, 1, 0, 0.5)).toBe(Infinity); // x'(0) = 0
  });
  it('in seconds: a 2 s bezier segment scales dy/dt by 1/h^k; segmentDerivativeBound covers evaluateDerivative', () => {
    const doc = makeDoc([{ time: 1, value: 0 }, { time: 3, value: 10 }],
      [{ kind: 'bezier', bezier: { h1: { time: 1.5, value: 4 }, h2: { time: 2.2, value: 11 } } }]);
    const c = prepareCurve(doc);
    const t = 2.1;
    const X = 0.55;
    expect(evaluateDerivative(c, t, 1)).toBeCloseTo(bezierEase(0.25, 0.6, 0, 4, 11, 10, X, 1) / 2, 12);
    expect(evaluateDerivative(c, t, 2)).toBeCloseTo(bezierEase(0.25, 0.6, 0, 4, 11, 10, X, 2) / 4, 12);
    let m = 0;
    for (const tt of linspace(1, 3, 400)) m = Math.max(m, Math.abs(evaluateDerivative(c, Math.min(tt, 2.999999), 2)));
    expect(segmentDerivativeBound(c, 0, 2, 1, 3)).toBeGreaterThanOrEqual(m);
  });
});
