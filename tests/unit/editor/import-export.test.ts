import { describe, expect, it } from 'vitest';
import BezierEasing from 'bezier-easing';
import { easeSinInOut } from 'd3-ease';
import validator from 'gltf-validator';
import { DEMO_PROFILES, readPack } from '../../../shared/bake';
import { evaluate, prepareCurve } from '../../../shared/curve';
import { EXPORT_FORMATS, exportCurve } from '../../../src/features/editor/import-export/export-files';
import { importCssEasing, importSamples, parseTolerance } from '../../../src/features/editor/import-export/import-curve';
import { EDITOR_EXAMPLES } from '../../../src/features/editor/store/examples';

const panel = EDITOR_EXAMPLES[0].doc;
const profile = (name: string) => DEMO_PROFILES.find((p) => p.name === name)!;

describe('pasting a CSS easing function', () => {
  it('ease becomes a curve with the W3C values, keeping the current curve name and what it drives', () => {
    const r = importCssEasing('  ease ', panel);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.doc.name).toBe(panel.name);
    expect(r.doc.drives).toBe(panel.drives);
    const c = prepareCurve(r.doc);
    // W3C CSS Easing Functions Level 1, ease at 0.25 / 0.5 / 0.75 (REFERENCES.md, exact to 6 places)
    expect(evaluate(c, 0.25)).toBeCloseTo(0.408511, 6);
    expect(evaluate(c, 0.5)).toBeCloseTo(0.802403, 6);
    expect(evaluate(c, 0.75)).toBeCloseTo(0.960459, 6);
    // bezier-easing 3.2.0 inside [0, 1] (REFERENCES.md: agrees to ~1e-14 on the keywords)
    const ref = BezierEasing(0.25, 0.1, 0.25, 1);
    for (let x = 0.05; x < 1; x += 0.1) expect(Math.abs(evaluate(c, x) - ref(x))).toBeLessThan(1e-9);
  });

  it('a typo is refused with its position and nothing is produced', () => {
    const r = importCssEasing('cubic-bezier(0.2, 0, 0.4', panel);
    expect(r.ok).toBe(false);
    expect(!r.ok && r.error).toMatch(/position \d+/);
  });
});

describe('importing motion samples', () => {
  // 121 samples of d3-ease 3.0.2 easeSinInOut, (1 − cos πt)/2 (REFERENCES.md)
  const n = 121;
  const csv = ['time,value', ...Array.from({ length: n }, (_, i) => `${i / (n - 1)},${easeSinInOut(i / (n - 1))}`)].join('\n');

  it('fits fewer keys than samples within the tolerance, and the curve follows d3-ease between the samples', () => {
    const r = importSamples(csv, 1e-4, panel);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.samples).toBe(n);
    expect(r.keys).toBeLessThan(20);
    expect(r.keys).toBe(r.doc.keys.length);
    expect(r.withinTolerance).toBe(true);
    expect(r.maxError).toBeLessThanOrEqual(1e-4);
    expect(r.doc.name).toBe(panel.name);
    const c = prepareCurve(r.doc);
    let worst = 0;
    for (let i = 0; i <= 1000; i++) worst = Math.max(worst, Math.abs(evaluate(c, i / 1000) - easeSinInOut(i / 1000)));
    // between samples the fit may differ from the sampled function a little more than at the samples
    expect(worst).toBeLessThan(2e-4);
  });

  it('a tighter tolerance takes more keys', () => {
    const loose = importSamples(csv, 1e-3, panel);
    const tight = importSamples(csv, 1e-5, panel);
    expect(loose.ok && tight.ok).toBe(true);
    if (loose.ok && tight.ok) expect(tight.keys).toBeGreaterThan(loose.keys);
  });

  it('bad samples and a bad tolerance are refused naming the line or the field', () => {
    const bad = importSamples('time,value\n0,0\n0.1,zero\n', 1e-3, panel);
    expect(!bad.ok && bad.error).toMatch(/^samples: line 3, column \d+: value "zero" is not a number/);
    const json = importSamples('[[0, 0], [0.5, 1], [0.4, 2]]', 1e-3, panel);
    expect(json.ok).toBe(false);
    expect(parseTolerance('-1')).toEqual({ ok: false, error: 'tolerance: must be a positive number, got "-1"' });
    expect(parseTolerance(' 0.002 ')).toEqual({ ok: true, value: 0.002 });
  });
});

describe('exporting in the baker output formats', () => {
  it('writes every format the target allows; CSS linear() only for a linear-kernel target', () => {
    for (const format of EXPORT_FORMATS) {
      const r = exportCurve(panel, profile('Console'), format);
      if (format === 'css') {
        expect(r.ok).toBe(false);
        expect(!r.ok && r.error).toMatch(/^format: CSS linear\(\) needs .* linear kernel/);
        continue;
      }
      expect(r.ok, format).toBe(true);
      if (r.ok) {
        expect(r.filename).toMatch(new RegExp(`^panel-slide-in\\.console\\.`));
        expect(r.maxError).toBeLessThanOrEqual(5e-4);
      }
    }
    const css = exportCurve(panel, profile('Web'), 'css');
    expect(css.ok && typeof css.data === 'string' && css.data).toMatch(/--tangentry-panel-slide-in: linear\(/);
  });

  it('the .gltf and .glb files pass the Khronos glTF validator', async () => {
    for (const format of ['gltf', 'glb'] as const) {
      const r = exportCurve(panel, profile('Console'), format);
      if (!r.ok) throw new Error(r.error);
      const bytes = typeof r.data === 'string' ? new TextEncoder().encode(r.data) : r.data;
      // gltf-validator 2.0.0-dev.3.10 validateBytes (REFERENCES.md)
      const report = await validator.validateBytes(bytes, { format, writeTimestamp: false });
      expect(report.issues.numErrors, JSON.stringify(report.issues.messages)).toBe(0);
    }
  });

  it('the binary pack holds the baked table of the chosen target', () => {
    const r = exportCurve(panel, profile('Handheld'), 'bin');
    if (!r.ok || typeof r.data === 'string') throw new Error('no bytes');
    const curves = readPack(r.data);
    expect(curves.map((c) => [c.name, c.kernel, c.encoding, c.count])).toEqual([['panel-slide-in', 'hermite', 'unorm16', r.entries]]);
  });

  it('the JSON table of a linear target, read back by plain linear interpolation, stays within its tolerance', () => {
    const r = exportCurve(panel, profile('Mobile'), 'json');
    if (!r.ok || typeof r.data !== 'string') throw new Error('no JSON');
    const [t] = JSON.parse(r.data).curves as { times: number[]; values: number[]; kernel: string; maxError: number }[];
    expect(t.kernel).toBe('linear');
    expect(t.times.length).toBe(r.entries);
    const c = prepareCurve(panel);
    const lerp = (x: number) => {
      let k = 0;
      while (k + 2 < t.times.length && x > t.times[k + 1]) k++;
      const s = (x - t.times[k]) / (t.times[k + 1] - t.times[k]);
      return t.values[k] + s * (t.values[k + 1] - t.values[k]);
    };
    // piecewise-linear reading of a table: common practice; the Mobile demo target has an absolute tolerance of 4e-3 (BRIEF)
    let worst = 0;
    const [a, b] = [t.times[0], t.times[t.times.length - 1]];
    for (let i = 0; i <= 2000; i++) { const x = a + ((b - a) * i) / 2000; worst = Math.max(worst, Math.abs(lerp(x) - evaluate(c, x))); }
    expect(worst).toBeLessThanOrEqual(t.maxError * (1 + 1e-9) + 1e-12);
    expect(t.maxError).toBeLessThanOrEqual(4e-3);
  });
});
