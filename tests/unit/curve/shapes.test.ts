import * as d3 from 'd3-ease';
import { describe, expect, it } from 'vitest';
import { shapeBreaks, shapeDerivativeBound, shapeValue, type Shape, type ShapeEase, type ShapeFamily } from '../../../shared/curve';
import { linspace } from './helpers';

// Sources: d3-ease 3.0.2 (npm package, formulas in its source) and REFERENCES.md check values.
const EASES: ShapeEase[] = ['in', 'out', 'in-out'];
type Fn = (t: number) => number;
const D3: Record<Exclude<ShapeFamily, 'spring'>, [Fn, Fn, Fn]> = {
  sine: [d3.easeSinIn, d3.easeSinOut, d3.easeSinInOut],
  quad: [d3.easeQuadIn, d3.easeQuadOut, d3.easeQuadInOut],
  cubic: [d3.easeCubicIn, d3.easeCubicOut, d3.easeCubicInOut],
  quart: [d3.easePolyIn.exponent(4), d3.easePolyOut.exponent(4), d3.easePolyInOut.exponent(4)],
  quint: [d3.easePolyIn.exponent(5), d3.easePolyOut.exponent(5), d3.easePolyInOut.exponent(5)],
  expo: [d3.easeExpIn, d3.easeExpOut, d3.easeExpInOut],
  circ: [d3.easeCircleIn, d3.easeCircleOut, d3.easeCircleInOut],
  back: [d3.easeBackIn, d3.easeBackOut, d3.easeBackInOut],
  elastic: [d3.easeElasticIn, d3.easeElasticOut, d3.easeElasticInOut],
  bounce: [d3.easeBounceIn, d3.easeBounceOut, d3.easeBounceInOut],
};
const S = linspace(0, 1, 400);

describe('shapes match d3-ease 3.0.2 to 1e-12', () => {
  for (const [family, fns] of Object.entries(D3) as [Exclude<ShapeFamily, 'spring'>, [Fn, Fn, Fn]][]) {
    EASES.forEach((ease, e) => {
      it(`${family} ${ease}`, () => {
        const shape: Shape = { family, ease };
        for (const s of S) expect(Math.abs(shapeValue(shape, s) - fns[e](s))).toBeLessThanOrEqual(1e-12);
      });
    });
  }
  it('custom parameters: back overshoot 2.5, elastic amplitude 1.4 period 0.45 (d3 .overshoot/.amplitude/.period)', () => {
    const back: Shape = { family: 'back', ease: 'in-out', params: { overshoot: 2.5 } };
    const el: Shape = { family: 'elastic', ease: 'out', params: { amplitude: 1.4, period: 0.45 } };
    const d3el = d3.easeElasticOut.amplitude(1.4).period(0.45);
    for (const s of S) {
      expect(Math.abs(shapeValue(back, s) - d3.easeBackInOut.overshoot(2.5)(s))).toBeLessThanOrEqual(1e-12);
      expect(Math.abs(shapeValue(el, s) - d3el(s))).toBeLessThanOrEqual(1e-12);
    }
  });
  it('REFERENCES.md check values at t = 0.3 and bounceOut(0.5)', () => {
    // REFERENCES.md §d3-ease 3.0.2
    expect(shapeValue({ family: 'cubic', ease: 'in-out' }, 0.3)).toBeCloseTo(0.108, 14);
    expect(shapeValue({ family: 'sine', ease: 'in-out' }, 0.3)).toBeCloseTo(0.20610737385376343, 14);
    expect(shapeValue({ family: 'back', ease: 'out' }, 0.3)).toBeCloseTo(0.90713226, 8);
    expect(shapeValue({ family: 'elastic', ease: 'out' }, 0.3)).toBeCloseTo(0.8758553274682307, 14);
    expect(shapeValue({ family: 'bounce', ease: 'out' }, 0.5)).toBe(0.765625);
  });
});

const ALL: Shape[] = [];
for (const family of [...Object.keys(D3), 'spring'] as ShapeFamily[]) for (const ease of EASES) ALL.push({ family, ease });
ALL.push({ family: 'spring', ease: 'out', params: { stiffness: 100, damping: 20, mass: 1, velocity: 3 } }); // critical
ALL.push({ family: 'spring', ease: 'out', params: { stiffness: 50, damping: 40, mass: 2, velocity: -1 } }); // over-damped
ALL.push({ family: 'spring', ease: 'in', params: { stiffness: 300, damping: 0, mass: 1 } }); // undamped
const DURATION = 0.8;
const label = (s: Shape) => `${s.family} ${s.ease}${s.params ? ' ' + JSON.stringify(s.params) : ''}`;

/** Sample points away from the shape's breaks and singular ends. */
function interior(shape: Shape): number[] {
  const br = [0, ...shapeBreaks(shape), 1];
  return linspace(0.013, 0.987, 97).filter((s) => br.every((b) => Math.abs(s - b) > 2e-3));
}

describe('exact derivatives agree with central differences of the exact function', () => {
  for (const shape of ALL) {
    it(label(shape), () => {
      const h = 1e-5;
      for (const s of interior(shape)) {
        for (const k of [1, 2, 3, 4] as const) {
          const lower = (k - 1) as 0 | 1 | 2 | 3;
          const fd = (shapeValue(shape, s + h, lower, DURATION) - shapeValue(shape, s - h, lower, DURATION)) / (2 * h);
          const exact = shapeValue(shape, s, k, DURATION);
          const scale = Math.max(1, Math.abs(exact), Math.abs(shapeValue(shape, s, lower, DURATION)) / h * 1e-9);
          expect(Math.abs(fd - exact) / scale, `order ${k} at s=${s}`).toBeLessThan(2e-5);
        }
      }
    });
  }
});

describe('derivative bounds never fall below sampled |f^(k)|', () => {
  for (const shape of ALL) {
    it(label(shape), () => {
      const br = [0, ...shapeBreaks(shape), 1];
      // sub-intervals between breaks, and a few pieces of each
      const pieces: [number, number][] = [];
      for (let j = 0; j + 1 < br.length; j++) {
        const a = br[j], b = br[j + 1];
        pieces.push([a, b], [a, a + (b - a) / 3], [a + (b - a) / 3, a + (2 * (b - a)) / 3], [a + (b - a) / 2, b]);
      }
      for (const [a, b] of pieces) {
        for (const k of [1, 2, 3, 4] as const) {
          const bound = shapeDerivativeBound(shape, k, a, b, DURATION);
          let sampled = 0;
          for (const s of linspace(a, b, 200)) {
            // stay off exact break points, where one side's piece is taken
            const x = Math.min(b - 1e-9, Math.max(a + 1e-9, s));
            const v = Math.abs(shapeValue(shape, x, k, DURATION));
            if (Number.isFinite(v)) sampled = Math.max(sampled, v);
          }
          expect(bound, `order ${k} on [${a}, ${b}]`).toBeGreaterThanOrEqual(sampled);
        }
      }
    });
  }
  it('sinInOut: max |f⁗| on [0,1] is π⁴/2 ≈ 48.7045 (REFERENCES.md)', () => {
    const b = shapeDerivativeBound({ family: 'sine', ease: 'in-out' }, 4, 0, 1);
    expect(b).toBeCloseTo(Math.PI ** 4 / 2, 9);
    expect(b).toBeCloseTo(48.7045, 4);
  });
  it('polynomial shapes give the exact maximum (quint in on [0.2, 0.6]: 120·0.6 for f⁗)', () => {
    // d/ds⁴ s⁵ = 120 s, max at 0.6 (exact calculus)
    expect(shapeDerivativeBound({ family: 'quint', ease: 'in' }, 4, 0.2, 0.6)).toBeCloseTo(72, 9);
  });
  it('an interval across a lower-order break has an unbounded higher derivative', () => {
    // cubicInOut is only C¹: f'' jumps +12 → −12 at ½ (REFERENCES.md)
    const cubic: Shape = { family: 'cubic', ease: 'in-out' };
    expect(shapeValue(cubic, 0.5 - 1e-12, 2)).toBeCloseTo(12, 6);
    expect(shapeValue(cubic, 0.5, 2)).toBeCloseTo(-12, 6);
    expect(shapeBreaks(cubic)).toEqual([0.5]);
    expect(shapeDerivativeBound(cubic, 3, 0.4, 0.6)).toBe(Infinity);
    expect(shapeDerivativeBound(cubic, 2, 0.4, 0.6)).toBeGreaterThanOrEqual(12);
  });
});

describe('breaks', () => {
  it('bounce out joints at 4/11, 8/11, 10/11 (d3-ease 3.0.2 source), in mirrored, in-out halved plus ½', () => {
    expect(shapeBreaks({ family: 'bounce', ease: 'out' })).toEqual([4 / 11, 8 / 11, 10 / 11].map((b) => expect.closeTo(b, 14)));
    expect(shapeBreaks({ family: 'bounce', ease: 'in' }).map((x) => x * 11)).toEqual([1, 3, 7].map((x) => expect.closeTo(x, 12)));
    expect(shapeBreaks({ family: 'bounce', ease: 'in-out' })).toHaveLength(7);
  });
  it('sine in-out is analytic at ½, so it lists no break', () => {
    expect(shapeBreaks({ family: 'sine', ease: 'in-out' })).toEqual([]);
  });
});

describe('spring: closed form of x″ = −(k/m)(x − 1) − (c/m)x′, x(0) = 0, x′(0) = v', () => {
  const cases = [
    { stiffness: 100, damping: 10, mass: 1, velocity: 0 }, // under-damped
    { stiffness: 100, damping: 20, mass: 1, velocity: 3 }, // critical
    { stiffness: 50, damping: 40, mass: 2, velocity: -1 }, // over-damped
  ];
  for (const p of cases) {
    it(`satisfies the ODE and matches an RK4 integration ${JSON.stringify(p)}`, () => {
      const shape: Shape = { family: 'spring', ease: 'out', params: p };
      const D = 1.5; // s = τ/D
      expect(shapeValue(shape, 0, 0, D)).toBe(0);
      expect(shapeValue(shape, 0, 1, D) / D).toBeCloseTo(p.velocity, 12);
      for (const s of linspace(0, 1, 30)) {
        const x = shapeValue(shape, s, 0, D);
        const x1 = shapeValue(shape, s, 1, D) / D;
        const x2 = shapeValue(shape, s, 2, D) / D ** 2;
        expect(x2 + (p.damping / p.mass) * x1 + (p.stiffness / p.mass) * (x - 1)).toBeCloseTo(0, 9);
      }
      // Independent reference: classical 4th-order Runge–Kutta (common practice), dt = 1e-4 s.
      let x = 0, v = p.velocity;
      const f = (xx: number, vv: number) => -(p.stiffness / p.mass) * (xx - 1) - (p.damping / p.mass) * vv;
      const dt = 1e-4;
      const steps = Math.round(D / dt);
      for (let j = 1; j <= steps; j++) {
        const k1x = v, k1v = f(x, v);
        const k2x = v + (dt / 2) * k1v, k2v = f(x + (dt / 2) * k1x, v + (dt / 2) * k1v);
        const k3x = v + (dt / 2) * k2v, k3v = f(x + (dt / 2) * k2x, v + (dt / 2) * k2v);
        const k4x = v + dt * k3v, k4v = f(x + dt * k3x, v + dt * k3v);
        x += (dt / 6) * (k1x + 2 * k2x + 2 * k3x + k4x);
        v += (dt / 6) * (k1v + 2 * k2v + 2 * k3v + k4v);
        if (j % 1500 === 0) expect(shapeValue(shape, (j * dt) / D, 0, D)).toBeCloseTo(x, 9);
      }
    });
  }
});
