/**
 * Window trials (shared/bake/entries.ts) read the same numbers as a fully built table: for random curves
 * of every segment kind, unorm and f32 profiles and random counts, the entries a window trial fills, and
 * all entries when it measures the whole table, equal the decoded entries of uniformTable for that count
 * (which finds the unorm quantizer from the minimum and maximum of every entry). A window is measured on
 * the trial's whole table from the region holding its start, and only the entries the window reads are
 * filled: with the time and numbers of every other entry made NaN the window's figure is still that of the
 * whole built table. Tables of at most
 * WINDOW_MIN_ENTRIES (./entries.ts) entries are filled whole before their window is measured. For unorm, the window first
 * seen before quantization holds numbers within half a code step of the quantized ones, and its estimate
 * is within the shift run() allows for of the quantized window's (the proof behind the raw window test).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DEMO_PROFILES, sourceFromDocument, type Profile } from '../../../shared/bake';
import { WindowTrials, pieceOrder, unormShift, type TrialView } from '../../../shared/bake/entries';
import { findBreaks } from '../../../shared/bake/breaks';
import { CUBIC } from '../../../shared/bake/proxy';
import { entryProxy, uniformTable } from '../../../shared/bake/uniform';
import { measureError } from '../../../shared/bake/measure';
import { randomCurve, rng } from '../../../bench/library';

/** Whether the stand-ins of src hold a leaf without a cubic (whose entries run() takes exactly for the raw shift). */
function shapeOpen(src: ReturnType<typeof sourceFromDocument>, p: Profile): boolean {
  const P = entryProxy(src, 2e-3);
  return p.encoding !== 'f32' && P !== null && P.kind.some((k) => k !== CUBIC);
}

const PROFILES: Profile[] = [
  DEMO_PROFILES[1], // hermite unorm16
  DEMO_PROFILES[2], // linear unorm8
  { ...DEMO_PROFILES[1], name: 'h8', encoding: 'unorm8' },
  { ...DEMO_PROFILES[1], name: 'hf32', encoding: 'f32' },
];

describe('window trials fill the numbers of the whole table', () => {
  it('window entries and whole tables equal uniformTable for the same count (fast-check)', () => {
    let rawChecked = 0, originsChecked = 0, openChecked = 0;
    fc.assert(fc.property(
      fc.integer({ min: 0, max: 1e6 }), fc.constantFrom('step', 'linear', 'hermite', 'bezier', 'shape', undefined),
      fc.integer({ min: 0, max: PROFILES.length - 1 }), fc.integer({ min: 2, max: 600 }),
      fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 4 }),
      // values far from 0 against their range (the float32 rounding of a unorm offset then outweighs half a code step)
      fc.constantFrom(0, 0, 0, 300.25),
      (seed, kind, pi, n, where, lift) => {
        const doc = randomCurve(rng(seed), `w-${seed}`, kind as never, 6);
        for (const key of doc.keys) key.value += lift;
        const src = sourceFromDocument(doc);
        const p = PROFILES[pi];
        const tol = 2e-3;
        const br = findBreaks(src, 3);
        let want;
        try { want = uniformTable(src, p, n, br, tol); } catch { return; }
        const trials = new WindowTrials(src, p, br, entryProxy(src, tol));
        const A = src.times[0], B = src.times[src.times.length - 1];
        // failure spots, most recent first: each window is ±4 grid steps around its spot, clipped to the domain
        const spots = where.map((x) => A + (B - A) * x);
        const w = (4 * (B - A)) / (n - 1);
        const windows = spots.map((c) => [Math.max(A, c - w), Math.min(B, c + w)]);
        let windowChecked = 0;
        // view entry j against table entry j
        const same = (v: TrialView, j: number) => {
          expect(v.times[j]).toBe(want.times[j]);
          expect(v.values[j]).toBe(want.values[j]);
          if (p.kernel === 'hermite') expect(v.slopes![j]).toBe(want.slopes![j]);
        };
        // the entries a measure of [wa, wb] reads: from the last entry before wa to the first at or after wb
        const reads = (wa: number, wb: number): [number, number] => {
          const lb = (x: number) => { let k = 0; while (k < n && want.times[k] < x) k++; return k; };
          return [Math.max(0, lb(wa) - 1), Math.min(n, lb(wb) + 1)];
        };
        // the view with every entry outside [k0, k1) made NaN (its time −1e300, and its origin that of the
        // window's nearest entry, so a run of regions inside one cubic would reach into them): a measure that
        // read one would not give the same figure
        const poisoned = (v: TrialView, k0: number, k1: number): TrialView => {
          const times = Float64Array.from(v.times), values = Float64Array.from(v.values), slopes = v.slopes ? Float64Array.from(v.slopes) : null;
          const origins = v.origins ? { ...v.origins, fn: Int32Array.from(v.origins.fn) } : null;
          for (let k = 0; k < n; k++) {
            if (k >= k0 && k < k1) continue;
            times[k] = -1e300; values[k] = Number.NaN; if (slopes) slopes[k] = Number.NaN;
            if (origins) origins.fn[k] = origins.fn[k < k0 ? k0 : k1 - 1];
          }
          return { kernel: v.kernel, times, values, slopes, origins };
        };
        const estOpts = { tolerance: tol, estimate: true, includeEnd: false };
        const raw: number[] = [];
        let shift = Number.NaN, quantized = 0;
        trials.run(n, spots, tol,
          (v, stop, wa, wb, region) => {
            // the windows come in the spots' order, first all before quantization (unorm), then all after
            const i = stop !== tol ? raw.length : quantized++;
            expect([wa, wb]).toEqual(windows[i]);
            // the whole trial table, measured from the region holding wa; the window reads [k0, k1) alone
            expect(v.times.length).toBe(n);
            let holds = -1;
            while (holds + 1 < n && want.times[holds + 1] <= wa) holds++;
            expect(region).toBe(holds);
            const [k0, k1] = reads(wa, wb);
            expect(k1).toBeGreaterThan(k0);
            for (let k = k0; k < k1; k++) expect(v.times[k]).toBe(want.times[k]);
            const opts = { ...estOpts, startRegion: region };
            const figure = measureError(src, v, opts, wa, wb).certified;
            expect(measureError(src, poisoned(v, k0, k1), opts, wa, wb).certified).toBe(figure);
            if (stop !== tol) {
              // the unorm window before quantization: each number within the quantizer's shift (half a code step
              // and the float32 rounding of its offset) of the quantized one; pass on (figure 0) so that the
              // quantized window is measured as well
              const M = p.encoding === 'unorm8' ? 255 : 65535;
              const sv = unormShift(Math.min(...want.values), Math.max(...want.values), M);
              for (let j = k0; j < k1; j++) expect(Math.abs(v.values[j] - want.values[j])).toBeLessThanOrEqual(sv + 1e-12);
              raw.push(figure);
              shift = stop - tol;
              // the shift allowed for covers the range of every entry of the built table (values, and slopes over h/4)
              let need = sv;
              if (p.kernel === 'hermite') {
                const ms = Array.from(want.slopes!).filter((x) => !Number.isNaN(x));
                need += ((want.times[n - 1] - want.times[0]) / (n - 1) / 4) * unormShift(Math.min(...ms), Math.max(...ms), M);
              }
              expect(shift).toBeGreaterThanOrEqual(need);
              if (shapeOpen(src, p)) openChecked++;
              return 0;
            }
            // the numbers the window reads are the built table's, and so is its figure
            for (let j = k0; j < k1; j++) { same(v, j); windowChecked++; }
            expect(figure).toBe(measureError(src, want, estOpts, wa, wb).certified);
            // quantizing moves the window's estimate by at most the shift the raw test allows for
            if (raw.length > 0) { expect(Math.abs(figure - raw[i])).toBeLessThanOrEqual(shift); rawChecked++; }
            // pass on to the next window; the last one rejects, so the whole table is not filled
            return i === spots.length - 1 ? Infinity : 0;
          },
          () => ({ e: 0, at: 0 }));
        // every trial measured each window first (a window holds at least one entry, the region's ends)
        expect(windowChecked).toBeGreaterThan(0);
        expect(quantized).toBe(spots.length);
        expect(raw.length === 0 || raw.length === spots.length).toBe(true);
        trials.run(n, [], tol, () => 0, (v) => {
          for (let k = 0; k < n; k++) same(v, k);
          // the view's entry origins let the measure skip regions inside one cubic: the figures are the same
          expect(v.origins).toBeTruthy();
          const bare = { kernel: v.kernel, times: v.times, values: v.values, slopes: v.slopes };
          for (const opts of [{ tolerance: tol }, { tolerance: tol, estimate: true }]) {
            expect(measureError(src, v, opts)).toEqual(measureError(src, bare, opts));
          }
          // a measurement that only decides skips other pieces with the origins: the same answer, and the
          // same figures where it stops
          const decide = { tolerance: tol, estimate: true, stopAbove: tol, decideOnly: true };
          const withO = measureError(src, v, decide), without = measureError(src, bare, decide);
          expect(withO.certified > tol).toBe(without.certified > tol);
          if (without.certified > tol) expect(withO).toEqual(without);
          // a range of the table measured from its start region with every entry it should not read poisoned
          for (const [wa, wb] of windows) {
            let region = -1;
            while (region + 1 < n && v.times[region + 1] <= wa) region++;
            const [k0, k1] = reads(wa, wb);
            const o = { ...estOpts, startRegion: region };
            expect(measureError(src, poisoned(v, k0, k1), o, wa, wb)).toEqual(measureError(src, bare, estOpts, wa, wb));
          }
          originsChecked++;
          return { e: 0, at: 0 };
        });
      }), { numRuns: 200, seed: 4242 });
    expect(rawChecked).toBeGreaterThan(30);
    expect(originsChecked).toBeGreaterThan(100);
    // raw windows of curves with stand-in leaves that have no cubic (slivers next to a vertical tangent)
    expect(openChecked).toBeGreaterThan(2);
  });
});

describe('piece order for the unorm extremes', () => {
  it('is a stable sort by the range ends, up or down, ties and infinite ends by index (fast-check)', () => {
    const end = fc.oneof(fc.integer({ min: -5, max: 5 }).map((x) => x / 4), fc.constantFrom(-Infinity, Infinity), fc.double({ min: -10, max: 10, noNaN: true }));
    fc.assert(fc.property(fc.array(end, { minLength: 0, maxLength: 300, size: 'max' }), fc.constantFrom(0, 1), fc.boolean(), (ends, o, down) => {
      const count = ends.length >> 1;
      const R = Float64Array.from(ends.slice(0, 2 * count));
      const key = (q: number) => R[2 * q + o];
      // the reference: Array.prototype.sort (stable, ECMA-262 §23.1.3.30) by key, then by index
      const want = Array.from({ length: count }, (_, q) => q).sort((x, y) => (key(x) === key(y) ? x - y : (down ? key(y) > key(x) : key(x) > key(y)) ? 1 : -1));
      expect(Array.from(pieceOrder(R, o as 0 | 1, count, down))).toEqual(want);
    }), { numRuns: 400 });
  });
});
