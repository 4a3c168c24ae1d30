// The command line run as a child process: `tsx cli/index.ts ...` through node_modules/.bin/tsx, the
// binary `npx tsx` resolves to (called directly to save npx's start-up second per run). Expected values come from
// outside the project: W3C CSS Easing (REFERENCES.md check values), d3-ease 3.0.2 (samples to fit),
// and a glTF asset whose tracks are checked against the glTF 2.0 §3.11 LINEAR rule by hand.
import { describe, expect, it, beforeAll, afterAll } from 'vitest';
import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import * as d3 from 'd3-ease';
import { writeGltf } from '../../../shared/convert/gltf-write';
import { evaluate, parseCurveDocument, prepareCurve } from '../../../shared/curve';

const ROOT = resolve(__dirname, '../../..');
let dir = '';

function cli(...args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  return new Promise((res) => {
    execFile(join(ROOT, 'node_modules/.bin/tsx'), ['cli/index.ts', ...args], { cwd: ROOT, timeout: 60_000 }, (err, stdout, stderr) => {
      const code = err ? (typeof (err as { code?: unknown }).code === 'number' ? (err as { code: number }).code : 1) : 0;
      res({ code, stdout, stderr });
    });
  });
}

const doc = (name: string) => ({
  format: 'tangentry.curve', version: 1, name, units: { time: 's', value: 'px' }, before: 'clamp', after: 'clamp',
  frameRate: 60, drives: 'position', tags: [],
  keys: [
    { time: 0, value: 0, slopeIn: 0, slopeOut: 0, rule: 'manual', slopes: 'joined' },
    { time: 1, value: 10, slopeIn: 0, slopeOut: 0, rule: 'manual', slopes: 'joined' },
  ],
  segments: [{ kind: 'linear' }],
});

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'tangentry-cli-'));
  writeFileSync(join(dir, 'one.json'), JSON.stringify(doc('panel-x')));
  writeFileSync(join(dir, 'many.json'), JSON.stringify({ curves: [doc('a'), { ...doc('b'), frameRate: -1 }] }));
  writeFileSync(join(dir, 'two.json'), JSON.stringify({ curves: [doc('a'), doc('b')] }));
  const w = writeGltf([{ name: 'crate', interpolation: 'LINEAR', times: new Float32Array([0, 2]), output: new Float32Array([1, 5]) }]);
  writeFileSync(join(dir, 'crate.gltf'), JSON.stringify(w.json));
  writeFileSync(join(dir, 'crate.glb'), w.glb());
  const lines = ['time,value'];
  for (let i = 0; i <= 500; i++) lines.push(`${i / 500},${d3.easeSinInOut(i / 500)}`);
  writeFileSync(join(dir, 'samples.csv'), lines.join('\n'));
  writeFileSync(join(dir, 'bad.csv'), 'time,value\n0,0\n0.5,0.4\n0.7,oops\n');
});
afterAll(() => { if (dir) rmSync(dir, { recursive: true, force: true }); });

describe('cli eval', () => {
  it('evaluates CSS easings per the W3C specification, also outside [0,1]', async () => {
    const [a, b] = await Promise.all([cli('eval', 'ease', '--at', '-0.5,1.5'), cli('eval', 'linear(0, 0.25 75%, 1)', '--at', '-0.5,0.5,0.9,1.5')]);
    expect(a.code, a.stderr).toBe(0);
    const va = JSON.parse(a.stdout).curves[0];
    expect(va.name).toBe('ease');
    // REFERENCES.md: ease(−0.5) = −0.2, ease(1.5) = 1
    expect(va.values[0]).toBeCloseTo(-0.2, 14);
    expect(va.values[1]).toBe(1);
    // REFERENCES.md: linear(0, 0.25 75%, 1) → −1/6, 1/6, 0.7, 2.5
    const vb = JSON.parse(b.stdout).curves[0].values;
    [-1 / 6, 1 / 6, 0.7, 2.5].forEach((v, i) => expect(vb[i]).toBeCloseTo(v, 14));
  });

  it('evaluates curve JSON files (one document and {"curves": [...]}) and glTF (.gltf, .glb)', async () => {
    const [one, two, gltf, glb] = await Promise.all([
      cli('eval', join(dir, 'one.json'), '--at', '0,0.25,2'),
      cli('eval', join(dir, 'two.json'), '--at=0.5'),
      cli('eval', join(dir, 'crate.gltf'), '--at', '0,0.5,3'),
      cli('eval', join(dir, 'crate.glb'), '--at', '1'),
    ]);
    for (const r of [one, two, gltf, glb]) expect(r.code, r.stderr).toBe(0);
    expect(JSON.parse(one.stdout)).toEqual({ curves: [{ name: 'panel-x', values: [0, 2.5, 10] }] });
    expect(JSON.parse(two.stdout)).toEqual({ curves: [{ name: 'a', values: [5] }, { name: 'b', values: [5] }] });
    // glTF 2.0 §3.11 LINEAR between (0, 1) and (2, 5), clamped after the last key
    expect(JSON.parse(gltf.stdout)).toEqual({ curves: [{ name: 'crate/weights/0', values: [1, 2, 5] }] });
    expect(JSON.parse(glb.stdout)).toEqual({ curves: [{ name: 'crate/weights/0', values: [3] }] });
  });

  it('fails with a clear message and a non-zero exit', async () => {
    const [badCss, badDoc, badAt, missing, noCmd] = await Promise.all([
      cli('eval', 'cubic-bezier(0.1, 0.2, 1.3, 1)', '--at', '0'),
      cli('eval', join(dir, 'many.json'), '--at', '0'),
      cli('eval', 'ease', '--at', '0,x'),
      cli('eval', join(dir, 'nope.json'), '--at', '0'),
      cli('frobnicate'),
    ]);
    expect(badCss.code).toBe(1);
    expect(badCss.stderr).toMatch(/x2 = 1.3 must be in \[0, 1\] at position 23/);
    expect(badCss.stdout).toBe('');
    expect(badDoc.code).toBe(1);
    expect(badDoc.stderr).toMatch(/curves\[1\]\.frameRate/);
    expect(badAt.code).toBe(2);
    expect(badAt.stderr).toMatch(/--at: item 2 \("x"\) is not a finite number/);
    expect(missing.stderr).toMatch(/nope.json: no such file/);
    expect(noCmd.code).toBe(2);
    expect(noCmd.stderr).toMatch(/unknown command "frobnicate"/);
  });

  it('prints usage with --help', async () => {
    const [top, ev] = await Promise.all([cli('--help'), cli('eval', '--help')]);
    expect(top.code).toBe(0);
    expect(top.stdout).toMatch(/eval .*\n.*fit /);
    expect(ev.stdout).toMatch(/Usage: npm run --silent cli -- eval INPUT --at/);
  });
});

describe('cli fit', () => {
  it('prints a valid fitted curve document within the tolerance of d3 easeSinInOut', async () => {
    const r = await cli('fit', join(dir, 'samples.csv'), '--tolerance', '0.001');
    expect(r.code, r.stderr).toBe(0);
    const parsed = parseCurveDocument(JSON.parse(r.stdout));
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) return;
    expect(parsed.doc.name).toBe('samples');
    expect(parsed.doc.description).toMatch(/keys, max error/);
    const c = prepareCurve(parsed.doc);
    for (let i = 0; i <= 1000; i++) expect(Math.abs(evaluate(c, i / 1000) - d3.easeSinInOut(i / 1000))).toBeLessThanOrEqual(1e-3);
    expect(parsed.doc.keys.length).toBeLessThanOrEqual(5); // a uniform exact-slope Hermite fit needs 5 (fit.test.ts)
  });

  it('names the bad line of a CSV and exits non-zero', async () => {
    const [bad, noTol] = await Promise.all([cli('fit', join(dir, 'bad.csv'), '--tolerance', '0.001'), cli('fit', join(dir, 'samples.csv'))]);
    expect(bad.code).toBe(1);
    expect(bad.stderr).toMatch(/bad.csv: line 4, column 5: value "oops" is not a number/);
    expect(bad.stdout).toBe('');
    expect(noTol.code).toBe(2);
    expect(noTol.stderr).toMatch(/needs --tolerance/);
  });
});
