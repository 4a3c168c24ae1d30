/**
 * The cubic stand-ins of sampled segments (shared/bake/proxy.ts): each leaf's proven distance to the
 * source holds against dense evaluation with the curve engine, the four-point remainder bound
 * M4·h⁴/1944 is attained by f = t⁴ (the textbook bound is sharp there: Burden & Faires, Numerical
 * Analysis, Thm 3.3, from memory; max |Π(t − x_j)| = h⁴/81 for equally spaced nodes, derived in
 * proxy.ts), and uniform tables of sampled sources stay minimal under the measure that certifies them.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { bakeCurve, DEMO_PROFILES, measureError, sourceFromDocument, type Profile } from '../../../shared/bake';
import { proxyFor, CUBIC, CONSTANT, SAMPLED } from '../../../shared/bake/proxy';
import { findBreaks } from '../../../shared/bake/breaks';
import { bakeUniform, uniformTable } from '../../../shared/bake/uniform';
import { evaluate, prepareCurve } from '../../../shared/curve';
import { randomCurve, rng } from '../../../bench/library';
import { fnSource } from './sources';

const profile = (p: Partial<Profile>): Profile => ({ ...DEMO_PROFILES[0], ...p });

/** max over leaves of (dense |f − q|) / (the leaf's proven distance), with f from the curve engine's evaluate. */
function worstLeafRatio(doc: ReturnType<typeof randomCurve>, eps: number): { ratio: number; leaves: number } {
  const src = sourceFromDocument(doc);
  const P = proxyFor(src, eps);
  const c = prepareCurve(doc);
  let ratio = 0;
  for (let k = 0; k < P.a.length; k++) {
    if (P.kind[k] === SAMPLED) continue;
    const a = P.a[k], b = P.b[k];
    const q = (t: number) => { const u = t - a, o = 4 * k; return P.c[o] + u * (P.c[o + 1] + u * (P.c[o + 2] + u * P.c[o + 3])); };
    let worst = 0;
    // interior points only: at a leaf end on a key the engine's evaluate gives the next segment's value
    for (let j = 1; j < 200; j++) {
      const t = a + ((b - a) * j) / 200;
      worst = Math.max(worst, Math.abs(evaluate(c, t) - q(t)));
    }
    ratio = Math.max(ratio, worst / P.err[k]);
    expect(P.err[k]).toBeLessThanOrEqual(eps);
  }
  return { ratio, leaves: P.a.length };
}

describe('cubic stand-ins of sampled segments', () => {
  it('the four-point remainder bound M4·h⁴/1944 is attained by t⁴ (M4 = 24): max error h⁴/81', () => {
    const h = 0.5;
    const src = fnSource('quartic', 0, h, (t, o) => [t ** 4, 4 * t ** 3, 12 * t * t, 24 * t, 24][o] ?? 0, (o) => [h ** 4, 4 * h ** 3, 12 * h * h, 24 * h, 24][o] ?? 0);
    // eps large enough for one leaf: 24·h⁴/1944 ≤ eps/2
    const P = proxyFor(src, 1);
    expect(P.a.length).toBe(1);
    expect(P.kind[0]).toBe(CUBIC);
    let worst = 0;
    for (let j = 0; j <= 20_000; j++) {
      const t = (h * j) / 20_000, u = t;
      worst = Math.max(worst, Math.abs(t ** 4 - (P.c[0] + u * (P.c[1] + u * (P.c[2] + u * P.c[3])))));
    }
    expect(worst).toBeCloseTo(h ** 4 / 81, 9);
    expect(P.err[0]).toBeGreaterThanOrEqual(worst);
    expect(P.err[0]).toBeLessThan(worst * (1 + 1e-6));
  });

  it('every leaf of random bezier and shape curves is within its proven distance (dense check with the curve engine)', () => {
    fc.assert(fc.property(fc.integer({ min: 0, max: 1e6 }), fc.constantFrom('bezier', 'shape', undefined), fc.constantFrom(1e-4, 1e-5, 1e-6), (seed, kind, eps) => {
      const doc = randomCurve(rng(seed), `p-${seed}`, kind as 'bezier' | 'shape' | undefined, 5);
      const { ratio } = worstLeafRatio(doc, eps);
      expect(ratio).toBeLessThanOrEqual(1);
    }), { numRuns: 60, seed: 20261202 });
  });

  it('vertical tangents end in constant slivers whose distance covers the source', () => {
    const doc = randomCurve(rng(1), 'circ', 'shape', 2);
    doc.segments = [{ kind: 'shape', shape: { family: 'circ', ease: 'in-out' } }];
    const src = sourceFromDocument(doc);
    const P = proxyFor(src, 1e-5);
    const slivers = Array.from(P.kind).filter((k) => k === CONSTANT).length;
    expect(slivers).toBeGreaterThan(0);
    expect(worstLeafRatio(doc, 1e-5).ratio).toBeLessThanOrEqual(1);
  });
});

describe('uniform tables of sampled sources', () => {
  it('count − 1 … count − 4 entries are not certified within the tolerance (bezier and shape curves)', () => {
    let checked = 0;
    for (let s = 0; s < 10; s++) {
      const src = sourceFromDocument(randomCurve(rng(700 + s), `m-${s}`, s % 2 ? 'bezier' : 'shape', 4));
      const tol = 2e-3;
      const p = profile({ kernel: s % 3 ? 'hermite' : 'linear', layout: 'uniform', encoding: 'f32', tolerance: { mode: 'absolute', value: tol } });
      const br = findBreaks(src);
      const r = bakeUniform(src, p, tol, br, 60);
      if (typeof r === 'string') continue;
      checked++;
      // the table the bake returned is the one uniformTable builds for that count and tolerance
      expect(Array.from(uniformTable(src, p, r.table.count, br, tol).values)).toEqual(Array.from(r.table.values));
      for (let n = r.table.count - 1; n >= Math.max(2, r.table.count - 4); n--) {
        expect(measureError(src, uniformTable(src, p, n, br, tol), { tolerance: tol }).certified).toBeGreaterThan(tol);
      }
    }
    expect(checked).toBeGreaterThan(5);
  });

  it('entry values read from the stand-ins stay within their distance of the source', () => {
    for (let s = 0; s < 12; s++) {
      const doc = randomCurve(rng(900 + s), `e-${s}`, s % 2 ? 'bezier' : 'shape', 4);
      const src = sourceFromDocument(doc);
      const b = bakeCurve(src, DEMO_PROFILES[1]);
      if (!b.ok) continue;
      const c = prepareCurve(doc);
      const eps = 0.05 * b.report.tolerance;
      const T = b.table.times, V = b.table.values;
      // decoded unorm16 values: round-off ≤ scale/(2·65535) on top of the stand-in's distance
      const q = b.table.valueScale / (2 * 65535);
      for (let k = 0; k + 1 < T.length; k++) expect(Math.abs(V[k] - evaluate(c, T[k]))).toBeLessThanOrEqual(eps + q + 1e-12);
    }
  });
});
