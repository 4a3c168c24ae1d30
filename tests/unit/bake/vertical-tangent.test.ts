/**
 * Non-finite numbers never pass as certified: vertical tangents of the source (circ shapes, bezier
 * handles with dx/ds = 0) get finite table slopes or a clear failure, NaN errors count as failures, and
 * every table reported ok is within its tolerance by an independent dense check (./dense-check.ts:
 * the curve engine's evaluate at ≥ 20 000 float32 times against our own lerp / Hermite reconstruction).
 */
import { describe, expect, it } from 'vitest';
import { bakeCurve, DEMO_PROFILES, measureError, sourceFromDocument, type Profile } from '../../../shared/bake';
import { firstNonFinite } from '../../../shared/bake/bake';
import { record, recorded, resetRecord } from '../../../shared/bake/measure';
import { maxAbsCubic } from '../../../shared/bake/poly';
import { parseCurveDocument, type CurveDocument, type Key, type Segment } from '../../../shared/curve';
import { randomCurve, rng } from '../../../bench/library';
import { polySource, fnSource, sinFn } from './sources';
import { allFinite, denseTableError } from './dense-check';

const key = (time: number, value: number): Key => ({ time, value, slopeIn: 0, slopeOut: 0, rule: 'manual', slopes: 'joined' });
const doc = (name: string, keys: Key[], segments: Segment[]): CurveDocument => {
  const d: CurveDocument = {
    format: 'tangentry.curve', version: 1, name, units: { time: 's', value: 'u' }, before: 'clamp', after: 'clamp',
    frameRate: 60, drives: 'position', tags: [], keys, segments,
  };
  const r = parseCurveDocument(d);
  if (!('ok' in r) || !r.ok) throw new Error(`test curve ${name} does not validate: ${JSON.stringify(r)}`);
  return d;
};

/** Curves with vertical tangents: circ in-out (infinite slope at ½), circ out then in (at both ends and the key), beziers. */
const CURVES: CurveDocument[] = [
  doc('circ-in-out', [key(0, 0), key(1, 1)], [{ kind: 'shape', shape: { family: 'circ', ease: 'in-out' } }]),
  doc('circ-out-in', [key(0.25, 0.2), key(0.75, 0.9), key(1.5, 0.1)], [
    { kind: 'shape', shape: { family: 'circ', ease: 'out' } }, { kind: 'shape', shape: { family: 'circ', ease: 'in' } },
  ]),
  // h1 at the start key's time: dx/ds = 0 at s = 0, a vertical tangent at t = 0
  doc('bezier-vertical-start', [key(0, 0), key(1, 1)], [{ kind: 'bezier', bezier: { h1: { time: 0, value: 0.6 }, h2: { time: 0.7, value: 1 } } }]),
  // x1 = 1, x2 = 0: x'(s) = 3(2s − 1)² vanishes at s = ½, a vertical tangent inside the segment (t = 0.5·h)
  doc('bezier-vertical-inside', [key(0, 0), key(0.5, 0.3), key(1.5, 1)], [
    { kind: 'hermite' }, { kind: 'bezier', bezier: { h1: { time: 1.5, value: 0.3 }, h2: { time: 0.5, value: 1 } } },
  ]),
];

/** Every demo profile, and each with every kernel × layout (hermite profiles write tables, not CSS). */
const PROFILES: Profile[] = DEMO_PROFILES.flatMap((p) =>
  (['linear', 'hermite'] as const).flatMap((kernel) => (['uniform', 'adaptive'] as const).map((layout): Profile => ({
    ...p, name: `${p.name}/${kernel}/${layout}`, kernel, layout, output: kernel === 'hermite' ? 'table' : p.output,
  }))));

describe('NaN errors count as failures', () => {
  it('record() folds a NaN error in as +Infinity (NaN > x is false, so it used to count as 0)', () => {
    resetRecord();
    record(1e-6, 0, 1e-6);
    record(Number.NaN, 0.5, Number.NaN);
    expect(recorded()).toEqual({ maxError: Infinity, certified: Infinity });
    resetRecord();
    record(2e-4, 0, Number.NaN);
    expect(recorded().certified).toBe(Infinity);
    expect(recorded().maxError).toBe(2e-4);
  });
  it('the exact max-error routine returns +Infinity for non-finite coefficients, never NaN', () => {
    expect(maxAbsCubic(Float64Array.of(0, Number.NaN, 0, 0), 1)).toBe(Infinity);
    expect(maxAbsCubic(Float64Array.of(0, -Infinity, 1, 0), 1)).toBe(Infinity);
    expect(maxAbsCubic(Float64Array.of(0, 1, Infinity, -Infinity), 1)).toBe(Infinity);
    expect(maxAbsCubic(Float64Array.of(1, -2, 0, 0), 1)).toBe(1); // finite cubics unchanged
  });
  it('measureError of a table with a NaN or infinite slope is uncertified on exact and sampled sources', () => {
    const exact = polySource('p', [{ t: 0, v: 0, mOut: 1 }, { t: 1, v: 1, mIn: 1 }], ['hermite']);
    const sampled = fnSource('s', 0, 1, sinFn, () => 1);
    for (const bad of [Number.NaN, -Infinity, Infinity]) {
      for (const src of [exact, sampled]) {
        const tab = { kernel: 'hermite' as const, times: Float64Array.of(0, 0.5, 1), values: Float64Array.of(0, src.value(0, 0.5, 0), src.value(0, 1, 0)), slopes: Float64Array.of(1, bad, 1) };
        const m = measureError(src, tab, { tolerance: 1e-3 });
        expect(m.certified, `${src.name} slope ${bad}`).toBe(Infinity);
        expect(m.certified <= 1e-3).toBe(false);
      }
    }
  });
  it('firstNonFinite names the first non-finite decoded number', () => {
    const t = { kernel: 'hermite', times: Float64Array.of(0, 1), values: Float64Array.of(0, 1), slopes: Float64Array.of(Number.NaN, 0) };
    expect(firstNonFinite(t as never)).toBe('slope 0 (NaN)');
    expect(firstNonFinite({ ...t, slopes: Float64Array.of(0, 0) } as never)).toBeNull();
  });
});

describe('vertical tangents: finite tables within tolerance, or a clear error', () => {
  for (const d of CURVES) {
    it(`${d.name} × ${PROFILES.length} profiles`, () => {
      const src = sourceFromDocument(d);
      let okHermite = 0;
      for (const p of PROFILES) {
        const b = bakeCurve(src, p);
        if (!b.ok) {
          expect(b.error, `${p.name}`).toContain(`curve "${d.name}"`);
          if (p.kernel === 'hermite' && /no uniform|cannot/.test(b.error)) expect(b.error).toMatch(/vertical tangent \(infinite slope\) at t = /);
          continue;
        }
        if (p.kernel === 'hermite') okHermite++;
        expect(allFinite(b.table), `${p.name}: every decoded number finite`).toBe(true);
        expect(Number.isFinite(b.report.certified) && b.report.certified <= b.report.tolerance).toBe(true);
        const dense = denseTableError(d, b.table, 20_000);
        expect(dense.max, `${p.name}: dense error at t = ${dense.at}`).toBeLessThanOrEqual(b.report.tolerance * (1 + 1e-9));
        expect(dense.max).toBeLessThanOrEqual(b.report.certified * (1 + 1e-9) + 1e-12);
      }
      // the adaptive hermite profiles (Console and the like) can place knots at the tangent: some must bake
      expect(okHermite, 'hermite bakes that succeeded').toBeGreaterThan(0);
    }, 120_000);
  }
});

describe('the 300-curve bench library × DEMO_PROFILES (bench/bake.bench.ts seeds)', () => {
  it('no ok bake holds a non-finite number; each is within tolerance by the dense check', () => {
    const KINDS = ['step', 'linear', 'hermite', 'bezier', 'shape', undefined] as const;
    const docs = Array.from({ length: 300 }, (_, i) => randomCurve(rng(90_000 + i), `c-${i}`, KINDS[i % KINDS.length], 6));
    let ok = 0, worst = 0;
    const bad: string[] = [];
    for (const p of DEMO_PROFILES) {
      for (const d of docs) {
        const b = bakeCurve(sourceFromDocument(d), p);
        if (!b.ok) { expect(b.error).toContain(`curve "${d.name}"`); continue; }
        ok++;
        if (!allFinite(b.table)) { bad.push(`${p.name} ${d.name}: non-finite number`); continue; }
        const dense = denseTableError(d, b.table, 20_000);
        worst = Math.max(worst, dense.max / b.report.tolerance);
        if (!(dense.max <= b.report.tolerance * (1 + 1e-9))) bad.push(`${p.name} ${d.name}: dense ${dense.max} at ${dense.at} > ${b.report.tolerance}`);
      }
    }
    expect(bad).toEqual([]);
    expect(ok).toBeGreaterThan(1000);
    expect(worst).toBeLessThanOrEqual(1 + 1e-9);
  }, 600_000);
});
