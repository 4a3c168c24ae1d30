import fc from 'fast-check';
import pchip from 'pchip';
import { describe, expect, it } from 'vitest';
import { evaluate, prepareCurve, resolveSlopes, type SlopeRule } from '../../../shared/curve';
import { linspace, makeDoc } from './helpers';

// REFERENCES.md worked example (Fritsch & Carlson 1980): x = [0,1,2,3], y = [0,0.5,2,2.1].
const X = [0, 1, 2, 3];
const Y = [0, 0.5, 2, 2.1];
const keysOf = (rule: SlopeRule, xs = X, ys = Y) => xs.map((time, i) => ({ time, value: ys[i], rule }));
const slopes = (rule: SlopeRule, xs = X, ys = Y) => resolveSlopes(makeDoc(keysOf(rule, xs, ys)).keys).map((k) => k.slopeOut);

describe('monotone (Fritsch–Carlson 1980)', () => {
  it('worked example → [0.5, 1, 0.297683, 0.037210] (REFERENCES.md)', () => {
    const m = slopes('monotone');
    [0.5, 1, 0.297683, 0.03721].forEach((v, i) => expect(m[i]).toBeCloseTo(v, 6));
  });
  it('agrees with npm pchip 1.0.2 slopes_monotone on the worked example and on random monotone data', () => {
    const ref = pchip.slopes_monotone(X.map((x, i) => [x, Y[i]] as [number, number]));
    slopes('monotone').forEach((v, i) => expect(v).toBeCloseTo(ref[i], 9));
    // pchip averages the two secants without weighting (as we do) and scales per interval; on
    // strictly increasing data where no two scaled intervals share a key the two agree.
    const xs = [0, 1, 2, 3, 4, 5];
    const ys = [0, 0.1, 0.2, 3, 3.1, 3.2];
    const r2 = pchip.slopes_monotone(xs.map((x, i) => [x, ys[i]] as [number, number]));
    slopes('monotone', xs, ys).forEach((v, i) => expect(v).toBeCloseTo(r2[i], 9));
  });
  it('property (fast-check): monotone data never overshoots between keys', () => {
    fc.assert(fc.property(
      fc.array(fc.tuple(fc.double({ min: 0.01, max: 5, noNaN: true }), fc.double({ min: 0, max: 10, noNaN: true })), { minLength: 2, maxLength: 12 }),
      fc.boolean(),
      (steps, decreasing) => {
        const xs = [0];
        const ys = [0];
        for (const [dt, dv] of steps) { xs.push(xs[xs.length - 1] + dt); ys.push(ys[ys.length - 1] + (decreasing ? -dv : dv)); }
        const c = prepareCurve(makeDoc(keysOf('monotone', xs, ys)));
        for (let i = 0; i + 1 < xs.length; i++) {
          const lo = Math.min(ys[i], ys[i + 1]), hi = Math.max(ys[i], ys[i + 1]);
          const eps = 1e-12 * (1 + Math.abs(lo) + Math.abs(hi));
          for (const t of linspace(xs[i], xs[i + 1], 40)) {
            const v = evaluate(c, t);
            if (v < lo - eps || v > hi + eps) return false;
          }
        }
        return true;
      },
    ), { numRuns: 200 });
  });
  it('a flat interval gets zero slopes at both ends, and a local extremum a zero slope', () => {
    expect(slopes('monotone', [0, 1, 2, 3], [0, 1, 1, 2])).toEqual([1, 0, 0, 1]);
    expect(slopes('monotone', [0, 1, 2], [0, 1, 0])[1]).toBe(0);
  });
});

describe('catmull-rom (cardinal, uneven spacing)', () => {
  it('reference data → [0.5, 1, 0.8, 0.1] and overshoots to 2.140916 on [2, 3] (REFERENCES.md)', () => {
    const m = slopes('catmull-rom');
    [0.5, 1, 0.8, 0.1].forEach((v, i) => expect(m[i]).toBeCloseTo(v, 12));
    const cr = prepareCurve(makeDoc(keysOf('catmull-rom')));
    const fcc = prepareCurve(makeDoc(keysOf('monotone')));
    let maxCr = -Infinity, maxFc = -Infinity;
    for (const t of linspace(2, 3, 20000)) { maxCr = Math.max(maxCr, evaluate(cr, t)); maxFc = Math.max(maxFc, evaluate(fcc, t)); }
    expect(maxCr).toBeCloseTo(2.140916, 6);
    expect(maxFc).toBeCloseTo(2.1, 12); // Fritsch–Carlson stays at 2.1
  });
  it('uneven spacing uses the wide secant (p₊ − p₋)/(t₊ − t₋), tension scales by (1 − c)', () => {
    const keys = makeDoc([{ time: 0, value: 0, rule: 'catmull-rom' }, { time: 1, value: 2, rule: 'catmull-rom', tension: 0.25 }, { time: 4, value: 5, rule: 'catmull-rom' }]).keys;
    const r = resolveSlopes(keys);
    expect(r[1].slopeIn).toBeCloseTo(0.75 * (5 / 4), 14);
    expect(r[1].slopeOut).toBe(r[1].slopeIn);
    expect(r[0].slopeOut).toBeCloseTo(2, 14); // end key: one-sided secant
    expect(r[2].slopeIn).toBeCloseTo(1, 14);
  });
});

describe('zero, secant, manual, joined/split, jumps', () => {
  it('zero gives 0; secant gives the chord to the previous key (in) and to the next key (out)', () => {
    expect(slopes('zero')).toEqual([0, 0, 0, 0]);
    const r = resolveSlopes(makeDoc(keysOf('secant')).keys);
    expect(r.map((k) => k.slopeIn)).toEqual([0.5, 0.5, 1.5, 0.1].map((v) => expect.closeTo(v, 14)));
    expect(r.map((k) => k.slopeOut)).toEqual([0.5, 1.5, 0.1, 0.1].map((v) => expect.closeTo(v, 14)));
  });
  it('secant keys make hermite segments exactly linear', () => {
    const c = prepareCurve(makeDoc(keysOf('secant')));
    for (const t of linspace(1, 2, 10)) expect(evaluate(c, t)).toBeCloseTo(0.5 + 1.5 * (t - 1), 13);
  });
  it('split keys: manual keeps both slopes; automatic rules use the one-sided secants', () => {
    const keys = makeDoc([
      { time: 0, value: 0 }, { time: 1, value: 0.5, slopeIn: 3, slopeOut: -2, slopes: 'split' },
      { time: 2, value: 2, rule: 'catmull-rom', slopes: 'split' }, { time: 3, value: 2.1, rule: 'monotone', slopes: 'split' },
    ]).keys;
    const r = resolveSlopes(keys);
    expect([r[1].slopeIn, r[1].slopeOut]).toEqual([3, -2]);
    expect([r[2].slopeIn, r[2].slopeOut]).toEqual([1.5, expect.closeTo(0.1, 14)]);
    expect([r[3].slopeIn, r[3].slopeOut]).toEqual([expect.closeTo(0.1, 14), expect.closeTo(0.1, 14)]);
  });
  it('slopes are recomputed when a neighbour moves', () => {
    const keys = makeDoc(keysOf('catmull-rom')).keys;
    const before = resolveSlopes(keys)[1].slopeOut;
    keys[2] = { ...keys[2], value: 5 };
    expect(resolveSlopes(keys)[1].slopeOut).not.toBe(before);
    expect(resolveSlopes(keys)[1].slopeOut).toBeCloseTo(5 / 2, 14);
  });
  it('rules never look across a jump (two keys at one time)', () => {
    const r = resolveSlopes(makeDoc([
      { time: 0, value: 0, rule: 'catmull-rom' }, { time: 1, value: 1, rule: 'catmull-rom' },
      { time: 1, value: 5, rule: 'catmull-rom' }, { time: 2, value: 7, rule: 'catmull-rom' },
    ]).keys);
    expect(r.map((k) => k.slopeOut)).toEqual([1, 1, 2, 2]);
  });
});
