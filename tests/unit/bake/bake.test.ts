import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { f16round } from '@petamoriken/float16';
import {
  bakeCurve, crc32, DEMO_PROFILES, evalTable, interpolationBound, measureError, parseProfile, roundF16, sourceFromDocument,
  writePack, readPack, C_EVALUATOR, writeGltfPack, cssCurve, makeQuantizer, encodeArray, type Profile, type BakeSource,
} from '../../../shared/bake';
import { decodeOne, encodeOne, roundHalfUp } from '../../../shared/bake/encoding';
import { rangeWidthBound, sourceRange } from '../../../shared/bake/ranges';
import { sourceValue } from '../../../shared/bake/source';
import { cubicBound } from '../../../shared/bake/measure';
import { maxAbsCubic } from '../../../shared/bake/poly';
import { bakeUniform, entryProxy, uniformTable } from '../../../shared/bake/uniform';
import { findBreaks } from '../../../shared/bake/breaks';
import { aprioriBound, boundOrder, derivativeBound } from '../../../shared/bake/bound';
import { randomCurve, rng } from '../../../bench/library';
import { polySource, fnSource, sinFn } from './sources';

/** Independent dense check: max |source − table| on a fine grid (decoding the table ourselves via evalTable). */
function denseError(src: BakeSource, tab: Parameters<typeof evalTable>[0], n = 4000): number {
  const a = src.times[0], b = src.times[src.times.length - 1];
  let m = 0;
  for (let j = 0; j <= n; j++) {
    const t = a + ((b - a) * j) / n;
    m = Math.max(m, Math.abs(sourceValue(src, t) - evalTable(tab, t)));
  }
  return m;
}

const profile = (p: Partial<Profile>): Profile => ({ ...DEMO_PROFILES[0], ...p });

describe('number formats', () => {
  it('binary16 rounding agrees with @petamoriken/float16 3.9.3 f16round', () => {
    fc.assert(fc.property(fc.double({ min: -70000, max: 70000, noNaN: true }), (x) => {
      const ref = f16round(x);
      expect(roundF16(x)).toBe(ref);
    }), { numRuns: 300 });
    for (const x of [65504, 65519.99, 2 ** -14, 2 ** -24, 2 ** -25, 1 + 2 ** -11, 1 + 3 * 2 ** -11]) expect(roundF16(x)).toBe(f16round(x));
  });
  it('unorm round-off stays within R/(2(2^n−1)) (REFERENCES: glTF 2.0 / OpenGL ES 3.0 §2.1.6.1)', () => {
    fc.assert(fc.property(fc.array(fc.double({ min: -3, max: 5, noNaN: true }), { minLength: 2, maxLength: 50 }), (xs) => {
      const arr = Float64Array.from(xs);
      const lo = Math.min(...xs), hi = Math.max(...xs);
      for (const [enc, M] of [['unorm8', 255], ['unorm16', 65535]] as const) {
        const e = encodeArray(makeQuantizer(enc, lo, hi), arr);
        for (let i = 0; i < xs.length; i++) expect(Math.abs(e.decoded[i] - xs[i])).toBeLessThanOrEqual(((hi - lo) / (2 * M)) * (1 + 1e-6) + 1e-12);
      }
    }), { numRuns: 150 });
  });
  it('encodeArray gives the codes and decoded numbers of encodeOne and decodeOne number by number (fast-check)', () => {
    fc.assert(fc.property(fc.array(fc.double({ min: -3, max: 5, noNaN: true }), { minLength: 1, maxLength: 50 }), fc.constantFrom(0, 1e-3, -0.25), (xs, widen) => {
      const arr = Float64Array.from(xs);
      const lo = Math.min(...xs) - Math.abs(widen), hi = Math.max(...xs) + widen;
      for (const enc of ['unorm8', 'unorm16', 'f32', 'f16'] as const) {
        const q = makeQuantizer(enc, lo, hi);
        const e = encodeArray(q, arr);
        for (let i = 0; i < xs.length; i++) {
          const c = encodeOne(q, xs[i]);
          expect(e.codes[i]).toBe(enc === 'f32' ? c : c + 0); // unorm: the stored code (−0 is stored as 0)
          expect(Object.is(e.decoded[i], decodeOne(q, c))).toBe(true);
        }
      }
    }), { numRuns: 200 });
  });
  it('CRC-32 check value of "123456789" is 0xCBF43926 (common practice, from memory)', () => {
    expect(crc32(new Uint8Array([...'123456789'].map((c) => c.charCodeAt(0))))).toBe(0xcbf43926);
  });
});

describe('profiles', () => {
  it('the four demo profiles validate and bad fields are named', () => {
    for (const p of DEMO_PROFILES) expect(parseProfile(p).ok).toBe(true);
    const r = parseProfile({ ...DEMO_PROFILES[0], tolerance: { mode: 'absolute', value: -1 }, encoding: 'f8' });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues.map((i) => i.message).join('|')).toMatch(/tolerance\.value.*\|encoding|encoding/);
  });
});

describe('a-priori bound: REFERENCES.md interpolation facts (Burden & Faires §3.4, from memory)', () => {
  it('sin on [0, π/2], h = π/48: hermite bound 4.78e-8 and actual ≤ bound; linear bound 5.35e-4', () => {
    const h = Math.PI / 48;
    expect(interpolationBound('hermite', 1, h)).toBeCloseTo(4.78e-8, 9);
    expect(interpolationBound('linear', 1, h)).toBeCloseTo(5.35e-4, 6);
    const src = fnSource('sin', 0, Math.PI / 2, sinFn, () => 1);
    for (const kernel of ['hermite', 'linear'] as const) {
      const tab = uniformTable(src, profile({ kernel, layout: 'uniform' }), 25, findBreaks(src));
      const m = measureError(src, { ...tab, values: Float64Array.from(tab.times, Math.sin), slopes: kernel === 'hermite' ? Float64Array.from(tab.times, Math.cos) : null }, { tolerance: 1e-8 });
      const bound = interpolationBound(kernel, 1, h);
      expect(m.maxError).toBeLessThanOrEqual(bound * 1.0001);
      expect(m.maxError).toBeGreaterThan(bound * (kernel === 'hermite' ? 0.9 : 0.95)); // REFERENCES: actual ≈ bound
    }
  });
  it('sinInOut with exact slopes: n = 4 → bound 4.95e-4 (M4 = π⁴/2)', () => {
    expect(interpolationBound('hermite', Math.PI ** 4 / 2, 1 / 4)).toBeCloseTo(4.95e-4, 6);
    expect(interpolationBound('hermite', Math.PI ** 4 / 2, 1 / 8)).toBeCloseTo(3.10e-5, 7);
  });
  it("a table's bound is the largest interval bound, however the intervals are grouped (fast-check)", () => {
    // reference: every interval bounded on its own, M from its overlapping segments (aprioriBound bounds
    // runs of intervals first and skips those that cannot raise the result)
    const plain = (src: BakeSource, kernel: Profile['kernel'], K: Float64Array, epsV: number, epsM: number): number | null => {
      let worst = 0;
      for (let k = 0; k + 1 < K.length; k++) {
        const a0 = K[k], a1 = K[k + 1];
        if (!(a1 > a0)) continue;
        const M = derivativeBound(src, boundOrder(kernel), a0, a1);
        if (!Number.isFinite(M)) return null;
        worst = Math.max(worst, interpolationBound(kernel, M, a1 - a0) + epsV + (kernel === 'hermite' ? ((a1 - a0) * epsM) / 4 : 0));
      }
      return worst;
    };
    let compared = 0;
    fc.assert(fc.property(
      fc.integer({ min: 0, max: 1e6 }), fc.constantFrom('linear', 'hermite', 'bezier', 'shape', undefined),
      fc.constantFrom('hermite', 'linear'), fc.integer({ min: 2, max: 400 }), fc.double({ min: 0, max: 1e-4, noNaN: true }),
      (seed, kind, kernel, n, eps) => {
        const src = sourceFromDocument(randomCurve(rng(seed), `b-${seed}`, kind as never, 6));
        const A = src.times[0], B = src.times[src.times.length - 1];
        const K = Float64Array.from({ length: n }, (_, k) => Math.fround(A + ((B - A) * k) / (n - 1)));
        // no breaks passed: every interval is bounded (breaks only void the bound)
        const got = aprioriBound(src, kernel as Profile['kernel'], K, [], eps, 2 * eps, true);
        const want = plain(src, kernel as Profile['kernel'], K, eps, 2 * eps);
        if (want === null) { expect(got).toBeNull(); return; }
        expect(got).toBe(want);
        compared++;
      }), { numRuns: 300, seed: 515 });
    expect(compared).toBeGreaterThan(150);
  });
});

/** Random poly-only source (step / linear / hermite with jumps). */
const polyArb = fc.record({
  vals: fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 2, maxLength: 6 }),
  slopes: fc.array(fc.double({ min: -3, max: 3, noNaN: true }), { minLength: 12, maxLength: 12 }),
  kinds: fc.array(fc.constantFrom('step', 'linear', 'hermite' as const), { minLength: 6, maxLength: 6 }),
  widths: fc.array(fc.double({ min: 0.05, max: 1, noNaN: true }), { minLength: 6, maxLength: 6 }),
});

describe('exact error routine', () => {
  it('agrees with dense sampling and is never below it (fast-check)', () => {
    fc.assert(fc.property(polyArb, fc.integer({ min: 2, max: 40 }), ({ vals, slopes, kinds, widths }, n) => {
      let t = 0;
      const keys = vals.map((v, i) => { const k = { t, v, mIn: slopes[2 * i], mOut: slopes[2 * i + 1] }; t += widths[i]; return k; });
      const src = polySource('p', keys, kinds.slice(0, keys.length - 1));
      const tab = uniformTable(src, profile({ kernel: 'hermite', layout: 'uniform' }), n, findBreaks(src));
      const m = measureError(src, tab, { tolerance: 1e-3 });
      const d = denseError(src, tab, 3000);
      expect(m.method).toBe('exact');
      expect(m.maxError).toBeGreaterThanOrEqual(d - 1e-12);
      // agreement: the dense grid gets within its resolution of the exact maximum, measured at its argmax
      expect(Math.abs(sourceValue(src, m.at) - evalTable(tab, m.at)) - m.maxError).toBeLessThan(1e-9 + m.maxError * 1e-6 + 1e-6);
    }), { numRuns: 150 });
  });

  it('the bound a measure skips pieces by is never below the maximum maxAbsCubic computes (fast-check)', () => {
    // the difference of two nearby cubics (a table against its source: large terms, small difference) and
    // arbitrary ones; the skip is output-neutral only if the bound holds for the computed maximum itself
    const coef = fc.double({ min: -1e3, max: 1e3, noNaN: true });
    fc.assert(fc.property(
      fc.tuple(coef, coef, coef, coef), fc.tuple(coef, coef, coef, coef), fc.double({ min: 0, max: 1, noNaN: true }),
      fc.double({ min: 1e-6, max: 20, noNaN: true }),
      (p, q, near, L) => {
        const d = p.map((x, j) => x - (x + near * 1e-6 * q[j]) * (1 - near * 1e-9)) as [number, number, number, number];
        for (const c of [d, p]) {
          const b = cubicBound(c[0], c[1], c[2], c[3], L);
          const e = maxAbsCubic(Float64Array.from(c), L);
          expect(b).toBeGreaterThanOrEqual(e);
          // and never looser than the triangle inequality |c0| + |c1|L + |c2|L² + |c3|L³ (with its margin)
          const tri = Math.abs(c[0]) + Math.abs(c[1]) * L + Math.abs(c[2]) * L * L + Math.abs(c[3]) * L * L * L;
          expect(b).toBeLessThanOrEqual(tri * (1 + 1e-11) + 1e-299);
        }
      }), { numRuns: 3000, seed: 99 });
    // NaN never skips: the bound is NaN (every comparison false)
    expect(cubicBound(0, Number.NaN, 0, 0, 1)).toBeNaN();
    expect(cubicBound(0, 0, 0, Number.NaN, 1)).toBeNaN();
  });

  it('rangeWidthBound is at least the width of the sampled and of a dense range, and finite for most curves (fast-check)', () => {
    let finite = 0;
    fc.assert(fc.property(fc.integer({ min: 0, max: 1e6 }), fc.constantFrom('step', 'linear', 'hermite', 'bezier', 'shape', undefined), (seed, kind) => {
      const src = sourceFromDocument(randomCurve(rng(seed), `r-${seed}`, kind as never, 6));
      const w = rangeWidthBound(src, entryProxy(src, 2e-3));
      const r = sourceRange(src, 0);
      expect(w).toBeGreaterThanOrEqual(r.max - r.min);
      const a = src.times[0], b = src.times[src.times.length - 1];
      let lo = Infinity, hi = -Infinity;
      for (let j = 0; j <= 5000; j++) { const v = sourceValue(src, a + ((b - a) * j) / 5000); if (Number.isFinite(v)) { lo = Math.min(lo, v); hi = Math.max(hi, v); } }
      expect(w).toBeGreaterThanOrEqual(hi - lo);
      if (Number.isFinite(w)) finite++;
    }), { numRuns: 300, seed: 5150 });
    expect(finite).toBeGreaterThan(280);
  });

  it('roundHalfUp is Math.round (ECMA-262 §21.3.2.28) for every double, −0 and NaN included (fast-check)', () => {
    const same = (y: number): void => { expect(Object.is(roundHalfUp(y), Math.round(y)), `y = ${y}`).toBe(true); };
    fc.assert(fc.property(fc.double(), same), { numRuns: 3000 });
    // codes of a unorm16 range and the halves between them
    fc.assert(fc.property(fc.integer({ min: -2, max: 65537 }), fc.constantFrom(0, 0.5, -0.5, 2 ** -40, -(2 ** -40)), (c, f) => same(c + f)), { numRuns: 2000 });
    // ties, the largest double below ½ (the sum y + 0.5 rounds up to 1), the ends of the range ⌊y + 0.5⌋ is used in
    for (const y of [0.49999999999999994, 0.5, 1.5, 2.5, 65534.5, 65535.49999999999, -0, 0, -0.5, -0.49999999999999994, -1.5,
      2 ** 52 - 0.5, 2 ** 52 - 1.5, 2 ** 52, 2 ** 52 + 1, 2 ** 53 + 2, Infinity, -Infinity, Number.NaN, Number.MIN_VALUE, -Number.MIN_VALUE]) same(y);
  });

  it('an estimate that only decides (decideOnly) gives the same answer, and the same figures wherever it stops (fast-check)', () => {
    // every segment kind, hermite and linear tables, stopping figures below, near and above the estimate
    let stopped = 0, through = 0;
    fc.assert(fc.property(
      fc.integer({ min: 0, max: 1e6 }), fc.constantFrom('step', 'linear', 'hermite', 'bezier', 'shape', undefined),
      fc.constantFrom('hermite', 'linear'), fc.integer({ min: 2, max: 300 }), fc.constantFrom(5e-4, 2e-3, 1e-2),
      fc.constantFrom(0.3, 0.9, 0.999, 1.001, 2),
      (seed, kind, kernel, n, tol, f) => {
        const src = sourceFromDocument(randomCurve(rng(seed), `d-${seed}`, kind as never, 6));
        const tab = uniformTable(src, profile({ kernel: kernel as Profile['kernel'], layout: 'uniform' }), n, findBreaks(src), tol);
        const full = measureError(src, tab, { tolerance: tol, estimate: true });
        const stop = full.certified * f;
        const plain = measureError(src, tab, { tolerance: tol, estimate: true, stopAbove: stop });
        const decided = measureError(src, tab, { tolerance: tol, estimate: true, stopAbove: stop, decideOnly: true });
        expect(decided.certified > stop).toBe(plain.certified > stop);
        expect(decided.certified > stop).toBe(full.certified > stop);
        if (plain.certified > stop) { expect(decided).toEqual(plain); stopped++; }
        else { expect(decided.certified).toBeLessThanOrEqual(plain.certified); through++; }
      }), { numRuns: 300, seed: 7118 });
    expect(stopped).toBeGreaterThan(100);
    expect(through).toBeGreaterThan(100);
  });
});

const LIB = Array.from({ length: 18 }, (_, i) => randomCurve(rng(1000 + i), `t-${i}`, (['step', 'linear', 'hermite', 'bezier', 'shape', undefined] as const)[i % 6], 4));

describe('baked tables stay within every profile tolerance (dense re-check)', () => {
  for (const p of DEMO_PROFILES) {
    it(`${p.name}: curves of every segment kind`, () => {
      let baked = 0;
      for (const doc of LIB) {
        const src = sourceFromDocument(doc);
        const b = bakeCurve(src, p);
        if (!b.ok) { expect(b.error).toMatch(/jumps|round-off|provably|stays within/); continue; }
        baked++;
        const d = denseError(src, b.table, 3000);
        expect(d).toBeLessThanOrEqual(b.report.tolerance * (1 + 1e-9));
        expect(b.report.certified).toBeLessThanOrEqual(b.report.tolerance);
        expect(b.report.certified).toBeGreaterThanOrEqual(d - 1e-12);
      }
      expect(baked).toBeGreaterThan(8);
    }, 60_000);
  }
});

describe('uniform minimality', () => {
  it('count − 1 … count − 4 entries do not meet the tolerance (measured exactly)', () => {
    for (let s = 0; s < 8; s++) {
      const src = sourceFromDocument(randomCurve(rng(50 + s), `m-${s}`, s % 2 ? 'hermite' : 'linear', 5));
      const p = profile({ kernel: s % 3 ? 'hermite' : 'linear', layout: 'uniform', encoding: 'f32', tolerance: { mode: 'absolute', value: 2e-3 } });
      const br = findBreaks(src);
      const r = bakeUniform(src, p, 2e-3, br, 60);
      if (typeof r === 'string') continue;
      for (let n = r.table.count - 1; n >= Math.max(2, r.table.count - 4); n--) {
        const m = measureError(src, uniformTable(src, p, n, br), { tolerance: 2e-3 });
        expect(m.certified).toBeGreaterThan(2e-3);
      }
    }
  });
  it('a curve no allowed count can bake is refused naming the largest count\'s largest error and where', () => {
    // a shape with a vertical tangent (the generated library's c-40): no linear table of ≤ 4096 entries is within 4e-3
    const src = sourceFromDocument(randomCurve(rng(90_040), 'c-40', 'shape', 6));
    const p = DEMO_PROFILES[2];
    const b = bakeCurve(src, p);
    expect(b.ok).toBe(false);
    if (b.ok) return;
    const m = /"c-40": no uniform table of at most 4096 entries .* still at least ([0-9.e-]+), near t = ([0-9.e-]+) s/.exec(b.error);
    expect(m, b.error).not.toBeNull();
    // the figure: the estimate of the 4096-entry table measured to its end (a lower bound of its error)
    const est = measureError(src, uniformTable(src, p, 4096, findBreaks(src, 3), p.tolerance.value), { tolerance: p.tolerance.value, estimate: true });
    expect(Number(m![1])).toBe(Number(est.certified.toPrecision(3)));
    expect(Number(m![2])).toBe(Number(est.at.toPrecision(4)));
    expect(denseError(src, uniformTable(src, p, 4096, findBreaks(src, 3), p.tolerance.value), 40000)).toBeGreaterThan(p.tolerance.value);
  });
  it('a jump wider than twice the tolerance is refused with the curve name and time', () => {
    const src = polySource('flash', [{ t: 0, v: 0 }, { t: 0.5, v: 0 }, { t: 0.5, v: 1 }, { t: 1, v: 1 }], ['linear', 'linear', 'linear']);
    const b = bakeCurve(src, DEMO_PROFILES[2]);
    expect(b.ok).toBe(false);
    if (!b.ok) expect(b.error).toMatch(/"flash".*t = 0\.5 s/);
    const a = bakeCurve(src, DEMO_PROFILES[0]);
    expect(a.ok && a.table.count).toBe(4); // adaptive: repeated time at the jump
  });
});

describe('outputs', () => {
  const docs = LIB.slice(0, 12);
  const profiles: Profile[] = [DEMO_PROFILES[0], profile({ name: 'h16', encoding: 'f16', layout: 'uniform' }), DEMO_PROFILES[1], profile({ name: 'l8', kernel: 'linear', encoding: 'unorm8', layout: 'adaptive', tolerance: { mode: 'relative', value: 5e-3 } })];
  const baked = profiles.flatMap((p) => docs.map((d) => bakeCurve(sourceFromDocument(d), p))).flatMap((b) => (b.ok ? [b] : []));

  it('binary pack is deterministic, round-trips, and the C evaluator (gcc) agrees with the TS evaluator to float32 precision', () => {
    const curves = baked.map((b) => ({ name: `${b.profile}/${b.name}`, table: b.table }));
    const bytes = writePack(curves);
    expect(writePack(curves)).toEqual(bytes);
    const back = readPack(bytes);
    expect(back.length).toBe(curves.length);
    const dir = mkdtempSync(join(tmpdir(), 'tg-c-'));
    writeFileSync(join(dir, 'tangentry.h'), C_EVALUATOR);
    writeFileSync(join(dir, 'pack.bin'), bytes);
    writeFileSync(join(dir, 'main.c'), `#include <stdio.h>\n#include <stdlib.h>\n#include "tangentry.h"\nint main(int argc, char **argv) {\n  FILE *f = fopen(argv[1], "rb"); static uint8_t buf[1 << 22]; size_t n = fread(buf, 1, sizeof buf, f); fclose(f);\n  tg_pack p; int rc = tg_pack_open(&p, buf, n); if (rc) { printf("ERR %d\\n", rc); return 1; }\n  for (uint32_t i = 0; i < p.count; i++) { tg_curve c; tg_pack_curve(&p, i, &c);\n    for (int j = 0; j <= 50; j++) { float t = c.start + (c.end - c.start) * (float)j / 50.0f; printf("%u %.9g %.9g\\n", i, t, tg_eval(&c, t)); } }\n  return 0; }\n`);
    execFileSync('/usr/bin/gcc', ['-std=c99', '-O2', '-Wall', '-Werror', '-o', join(dir, 'ev'), join(dir, 'main.c')]);
    const out = execFileSync(join(dir, 'ev'), [join(dir, 'pack.bin')], { maxBuffer: 1 << 26 }).toString().trim().split('\n');
    expect(out.length).toBe(curves.length * 51);
    for (const line of out) {
      const [i, t, v] = line.split(' ').map(Number);
      const tab = curves[i].table;
      const ref = evalTable(tab, t);
      let scale = 1;
      for (let k = 0; k < tab.count; k++) scale = Math.max(scale, Math.abs(tab.values[k]), tab.slopes ? Math.abs(tab.slopes[k]) : 0);
      expect(Math.abs(v - ref)).toBeLessThanOrEqual(2e-6 * scale); // float32 arithmetic, a few ulps of the largest term
    }
    bytes[40] ^= 1;
    expect(() => readPack(bytes)).toThrow(/crc32/);
  });

  it('glTF validates with gltf-validator and three.js GLTFLoader evaluates it within the tolerance', async () => {
    const { validateBytes } = (await import('gltf-validator')).default;
    const { GLTFLoader } = await import('three/examples/jsm/loaders/GLTFLoader.js');
    (globalThis as { ProgressEvent?: unknown }).ProgressEvent ??= class extends Event { constructor(t: string, i = {}) { super(t); Object.assign(this, i); } };
    const sel = baked.filter((b) => b.table.start >= 0).slice(0, 20);
    const curves = sel.map((b, i) => ({ name: `c${i}`, table: b.table }));
    const g = writeGltfPack(curves);
    const text = JSON.stringify(g.json);
    const report = await validateBytes(new TextEncoder().encode(text), { format: 'gltf', writeTimestamp: false });
    expect(report.issues.numErrors).toBe(0);
    const gltf = await new Promise<{ animations: { tracks: { name: string; createInterpolant(r: Float64Array): { evaluate(t: number): ArrayLike<number> }; getValueSize(): number }[] }[] }>((res, rej) => new GLTFLoader().parse(text, '', res as never, rej));
    const tracks = gltf.animations[0].tracks;
    sel.forEach((b, i) => {
      const tr = tracks[i];
      const size = tr.getValueSize() / (b.table.kernel === 'hermite' ? 3 : 1);
      const ip = tr.createInterpolant(new Float64Array(size));
      const src = sourceFromDocument(docs.find((d) => d.name === b.name)!);
      for (let j = 0; j <= 200; j++) {
        const t = b.table.start + ((b.table.end - b.table.start) * j) / 200;
        const v = ip.evaluate(t)[0];
        expect(Math.abs(v - sourceValue(src, t))).toBeLessThanOrEqual(b.report.tolerance + 1e-6 * (1 + Math.abs(v)));
      }
    });
  });

  it('CSS linear() evaluated with the CSS Easing Level 2 algorithm stays within the tolerance', () => {
    const web = DEMO_PROFILES[3];
    for (const doc of docs) {
      const src = sourceFromDocument(doc);
      const b = bakeCurve(src, web);
      if (!b.ok) continue;
      const css = cssCurve({ name: b.name, table: b.table });
      // W3C CSS Easing Level 2 §linear(): stops "output input%"; find the last stop with input ≤ x and interpolate
      const stops = css.easing.slice(7, -1).split(', ').map((s) => { const [o, p] = s.split(' '); return { out: Number(o), at: Number(p.slice(0, -1)) / 100 }; });
      const ease = (x: number) => {
        let k = 0;
        for (let j = 0; j < stops.length; j++) if (stops[j].at <= x) k = j;
        if (k >= stops.length - 1) return stops[stops.length - 1].out;
        const a = stops[k], c = stops[k + 1];
        return c.at === a.at ? c.out : a.out + ((x - a.at) / (c.at - a.at)) * (c.out - a.out);
      };
      for (let j = 0; j <= 2000; j++) {
        const x = j / 2000;
        const v = css.from + (css.to - css.from) * ease(x);
        expect(Math.abs(v - sourceValue(src, css.start + x * css.duration))).toBeLessThanOrEqual(3e-3 + 1e-12);
      }
    }
  });
});
