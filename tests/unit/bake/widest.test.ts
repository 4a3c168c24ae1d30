/**
 * The adaptive layout's width search (shared/bake/widest.ts): the width it returns passes, the crossing
 * of a monotone error lies within its precision above it, and a power-law error needs only a few
 * measurements (the bisection it replaced took 12–15 per knot).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { PRECISION, widestWidth } from '../../../shared/bake/widest';

describe('widest next interval', () => {
  it('monotone power-law errors: the result passes, the crossing is within the precision, few calls', () => {
    fc.assert(fc.property(fc.double({ min: 0.5, max: 6, noNaN: true }), fc.double({ min: 1e-3, max: 1e4, noNaN: true }), fc.double({ min: 1e-6, max: 0.5, noNaN: true }), fc.constantFrom(2, 4), (q, C, h, p) => {
      let calls = 0;
      const err = (w: number) => { calls++; return C * w ** q; };
      const target = 1e-4;
      const span = 1;
      if (err(span) <= target) return;
      calls = 0;
      const w = widestWidth(err, target, h, span, p, 1e-9);
      const crossing = (target / C) ** (1 / q);
      if (crossing < 1e-9) { expect(w).toBe(-1); return; }
      expect(w).toBeGreaterThan(0);
      expect(C * w ** q).toBeLessThanOrEqual(target);
      expect(crossing).toBeLessThanOrEqual(w * (1 + PRECISION) * (1 + 1e-12));
      // far fewer measurements than bisection from the first guess when the model's power is right
      if (q === p) expect(calls).toBeLessThanOrEqual(8);
      expect(calls).toBeLessThanOrEqual(40);
    }), { numRuns: 400, seed: 7 });
  });

  it('a wiggly (non-monotone) error still ends on a passing width with a failing one just above', () => {
    const seen: [number, number][] = [];
    const err = (w: number) => { const e = w ** 3 * (1 + 0.5 * Math.sin(60 * w)); seen.push([w, e]); return e; };
    const w = widestWidth(err, 1e-4, 0.01, 1, 4, 1e-9);
    expect(err(w)).toBeLessThanOrEqual(1e-4);
    expect(seen.some(([x, e]) => x > w && x <= w * (1 + PRECISION) * (1 + 1e-12) && e > 1e-4)).toBe(true);
  });

  it('returns −1 when no width above the minimum passes, and treats Infinity (not measurable) as failing', () => {
    expect(widestWidth(() => 1, 1e-4, 0.1, 1, 4, 1e-6)).toBe(-1);
    const w = widestWidth((x) => (x > 0.3 ? Infinity : x * x), 0.04, 0.25, 1, 2, 1e-9);
    expect(w).toBeGreaterThan(0.199 * (1 - PRECISION));
    expect(w).toBeLessThanOrEqual(0.2);
  });
});
