// Tests for shared/convert/gltf-export.ts and gltf-read.ts against Khronos gltf-validator
// 2.0.0-dev.3.10 (0 errors), three.js 0.187.0 GLTFLoader (evaluation, float32 precision) and the
// glTF 2.0 specification §3.11 / Appendix C (normalized integer decoding, CUBICSPLINE layout).
import { describe, expect, it } from 'vitest';
import validator from 'gltf-validator';
import { evaluate, prepareCurve, parseCurveDocument, type CurveDocument, type Key } from '../../../shared/curve';
import { exportGltf } from '../../../shared/convert/gltf-export';
import { readGltf } from '../../../shared/convert/gltf-read';
import { writeGltf } from '../../../shared/convert/gltf-write';
import { encodeBase64 } from '../../../shared/convert/base64';
import { loadWithThree, threeSample } from './three-helper';

const key = (time: number, value: number, slopeIn = 0, slopeOut = slopeIn): Key =>
  ({ time, value, slopeIn, slopeOut, rule: 'manual', slopes: slopeIn === slopeOut ? 'joined' : 'split' });
const curve = (name: string, keys: Key[], segments: CurveDocument['segments'], extra: Partial<CurveDocument> = {}): CurveDocument => ({
  format: 'tangentry.curve', version: 1, name, units: { time: 's', value: '' }, before: 'clamp', after: 'clamp',
  frameRate: 60, drives: 'other', tags: [], keys, segments, ...extra,
});

const exactCurves: CurveDocument[] = [
  curve('panel-slide', [key(0, 0, 0, 2), key(0.4, 1, -1, 3), key(1.2, 0.25, 0)], [{ kind: 'hermite' }, { kind: 'hermite' }]),
  curve('fade', [key(0, 1), key(0.5, 0.2), key(1, 0)], [{ kind: 'linear' }, { kind: 'linear' }]),
  curve('flash', [key(0.1, 0), key(0.2, 1), key(0.35, 0.5), key(0.6, 0)], [{ kind: 'step' }, { kind: 'step' }, { kind: 'step' }]),
  curve('mixed', [key(0, 0, 0, 1), key(0.5, 1, 1, 0), key(1, 2), key(1.5, 2.5)], [{ kind: 'hermite' }, { kind: 'linear' }, { kind: 'step' }]),
];
const convertedCurves: CurveDocument[] = [
  curve('jump-arc', [key(0, 0), key(0.6, 1.5)], [{ kind: 'shape', shape: { family: 'back', ease: 'out' } }]),
  curve('menu-ease', [key(0, 0), key(0.3, 1)], [{ kind: 'bezier', bezier: { h1: { time: 0.075, value: 0.1 }, h2: { time: 0.075, value: 1 } } }]),
  curve('with-jump', [key(0, 0), key(0.5, 1), key(0.5, 3), key(1, 2)], [{ kind: 'linear' }, { kind: 'linear' }, { kind: 'linear' }]),
];

/** Times where the curve's value jumps (step with a change, or two keys at one time). */
function jumpTimes(d: CurveDocument): number[] {
  const out: number[] = [];
  for (let i = 0; i + 1 < d.keys.length; i++) {
    const a = d.keys[i], b = d.keys[i + 1];
    if (a.time === b.time || (d.segments[i].kind === 'step' && a.value !== b.value)) out.push(b.time);
  }
  return out;
}

async function validate(bytes: Uint8Array, format: 'gltf' | 'glb') {
  // gltf-validator 2.0.0-dev.3.10 validateBytes (REFERENCES.md)
  const r = await validator.validateBytes(bytes, { format, writeTimestamp: false });
  expect(r.issues.numErrors, JSON.stringify(r.issues.messages)).toBe(0);
}

describe('exportGltf', () => {
  for (const c of [...exactCurves, ...convertedCurves]) expect(parseCurveDocument(c).ok, c.name).toBe(true);

  it('writes assets gltf-validator accepts with 0 errors (.gltf and .glb)', async () => {
    for (const set of [exactCurves, convertedCurves, [...exactCurves, ...convertedCurves]]) {
      const ex = exportGltf(set);
      await validate(new TextEncoder().encode(JSON.stringify(ex.json)), 'gltf');
      await validate(ex.glb(), 'glb');
    }
  });

  it('exact curves: three.js GLTFLoader agrees with evaluate() to float32 precision', async () => {
    const ex = exportGltf(exactCurves);
    expect(ex.report.map((r) => r.interpolation)).toEqual(['CUBICSPLINE', 'LINEAR', 'STEP', 'CUBICSPLINE']);
    const clip = await loadWithThree(JSON.stringify(ex.json));
    exactCurves.forEach((doc, j) => {
      const c = prepareCurve(doc);
      const r = ex.report[j];
      for (let i = 0; i <= 300; i++) {
        const t = (1.5 * i) / 300;
        // at a jump the float32-rounded key time decides the side: skip a 2e-6 s window around jumps
        if (jumpTimes(doc).some((j) => Math.abs(t - j) < 2e-6)) continue;
        const got = threeSample(clip.tracks[j], t);
        const want = evaluate(c, t);
        // three.js stores Float32 (REFERENCES.md: expect ~1.2e-7 relative differences)
        expect(Math.abs(got - want), `${doc.name} at ${t}`).toBeLessThanOrEqual(2e-6 * Math.max(1, Math.abs(want)));
      }
      expect(r.maxError).toBeLessThanOrEqual(1e-6);
    });
    expect(ex.report[0].exact && ex.report[1].exact && ex.report[2].exact).toBe(true);
    expect(ex.report[3].exact).toBe(false); // the step inside a cubic track is a ramp
  });

  it('bezier/shape segments are converted within the tolerance, reported and checked with three.js', async () => {
    const tol = 1e-4;
    const ex = exportGltf(convertedCurves, { tolerance: tol });
    const clip = await loadWithThree(ex.glb().slice().buffer);
    convertedCurves.forEach((doc, j) => {
      const c = prepareCurve(doc);
      const r = ex.report[j];
      expect(r.maxError).toBeLessThanOrEqual(tol + 1e-6);
      for (let i = 0; i <= 2000; i++) {
        const t = (1.2 * i) / 2000;
        if (jumpTimes(doc).some((x) => Math.abs(t - x) < 2e-6)) continue; // the jump instant itself
        expect(Math.abs(threeSample(clip.tracks[j], t) - evaluate(c, t)), `${doc.name} at ${t}`).toBeLessThanOrEqual(tol + 1e-5);
      }
    });
    expect(ex.report[0].notes.join(' ')).toMatch(/converted to hermite/);
    expect(ex.report[2].notes.join(' ')).toMatch(/ramp/);
  });

  it('edge cases: one key, jumps in STEP and LINEAR tracks, a spring shape, non-clamp outside rules', async () => {
    const edge: CurveDocument[] = [
      curve('single', [key(0.3, 2)], []),
      curve('step-jump', [key(0, 0), key(0.5, 1), key(0.5, 2), key(1, 3)], [{ kind: 'step' }, { kind: 'step' }, { kind: 'step' }]),
      curve('jump-first', [key(0, 0), key(0, 1), key(1, 3)], [{ kind: 'linear' }, { kind: 'linear' }]),
      curve('spring', [key(0, 0), key(1, 1)], [{ kind: 'shape', shape: { family: 'spring', ease: 'out', params: { stiffness: 170, damping: 26, mass: 1, velocity: 0 } } }], { after: 'repeat' }),
    ];
    for (const d of edge) expect(parseCurveDocument(d).ok, d.name).toBe(true);
    const ex = exportGltf(edge, { tolerance: 1e-3 });
    await validate(new TextEncoder().encode(JSON.stringify(ex.json)), 'gltf');
    expect(ex.report.map((r) => [r.interpolation, r.keys])).toEqual([['STEP', 1], ['STEP', 3], ['LINEAR', 2], ['CUBICSPLINE', ex.report[3].keys]]);
    expect(ex.report.slice(0, 3).every((r) => r.exact && r.maxError === 0)).toBe(true);
    expect(ex.report[3].maxError).toBeLessThanOrEqual(1e-3);
    expect(ex.report[3].notes.join(' ')).toMatch(/after "repeat" are not carried/);
    const clip = await loadWithThree(JSON.stringify(ex.json));
    const c = prepareCurve(edge[1]);
    for (const t of [0, 0.25, 0.5, 0.75, 1]) expect(threeSample(clip.tracks[1], t)).toBe(evaluate(c, t));
  });

  it('shifts negative times for every track and reports it', async () => {
    const ex = exportGltf([curve('early', [key(-0.5, 0), key(0.5, 1)], [{ kind: 'linear' }]), exactCurves[1]]);
    expect(ex.timeOffset).toBe(0.5);
    expect(ex.report[1].notes.join(' ')).toMatch(/shifted by \+0.5/);
    await validate(new TextEncoder().encode(JSON.stringify(ex.json)), 'gltf');
  });
});

describe('readGltf', () => {
  it('round-trips an exported asset: names, keys and values', () => {
    const ex = exportGltf(exactCurves.slice(0, 3));
    for (const input of [JSON.stringify(ex.json), ex.glb()]) {
      const imp = readGltf(input);
      expect(imp.curves.map((c) => c.name)).toEqual(['panel-slide/weights/0', 'fade/weights/0', 'flash/weights/0']);
      imp.curves.forEach((d, j) => {
        expect(parseCurveDocument(d).ok).toBe(true);
        const a = prepareCurve(d);
        const b = prepareCurve(exactCurves[j]);
        for (let i = 0; i <= 240; i++) {
          const t = i / 200;
          if (jumpTimes(exactCurves[j]).some((x) => Math.abs(t - x) < 2e-6)) continue;
          expect(Math.abs(evaluate(a, t) - evaluate(b, t))).toBeLessThanOrEqual(2e-6);
        }
      });
      // re-export keeps the node names (…/weights/0 rule) so a second import gives the same names
      const again = readGltf(JSON.stringify(exportGltf(imp.curves).json));
      expect(again.curves.map((c) => c.name)).toEqual(imp.curves.map((c) => c.name));
    }
  });

  it('CUBICSPLINE tangents are per second (three.js GLTFLoader agrees with the imported curve)', async () => {
    const w = writeGltf([{ name: 'dolly', interpolation: 'CUBICSPLINE', times: new Float32Array([0, 2, 2.5]), output: new Float32Array([0, 1, 4, -2, 3, 1, 0.5, -1, 0]) }]);
    const imp = readGltf(w.json);
    const c = prepareCurve(imp.curves[0]);
    expect(imp.curves[0].keys[1]).toMatchObject({ slopeIn: -2, slopeOut: 1, slopes: 'split' });
    const clip = await loadWithThree(JSON.stringify(w.json));
    for (let i = 0; i <= 250; i++) {
      const t = i / 100;
      expect(Math.abs(evaluate(c, t) - threeSample(clip.tracks[0], t))).toBeLessThanOrEqual(2e-6 * Math.max(1, Math.abs(evaluate(c, t))));
    }
  });

  /** A hand-made asset: node "crate" with translation (VEC3 float, external .bin) and rotation (VEC4 normalized SHORT). */
  function handMade(opts: { rotationType?: number; rotationData?: number[] } = {}) {
    const times = new Float32Array([0, 1]);
    const trans = new Float32Array([0, 1, 2, 3, 4, 5]);
    const rotType = opts.rotationType ?? 5122; // SHORT
    const rot = rotType === 5122 ? new Int16Array(opts.rotationData ?? [0, 0, 0, 32767, -32768, 16384, 0, 32767])
      : new Int8Array(opts.rotationData ?? [0, 0, 0, 127, -128, 64, 0, 127]);
    const bin = new Uint8Array(8 + 24 + rot.byteLength);
    bin.set(new Uint8Array(times.buffer), 0);
    bin.set(new Uint8Array(trans.buffer), 8);
    bin.set(new Uint8Array(rot.buffer), 32);
    const json = {
      asset: { version: '2.0' },
      nodes: [{ name: 'crate' }],
      buffers: [{ byteLength: bin.length, uri: 'crate.bin' }],
      bufferViews: [{ buffer: 0, byteOffset: 0, byteLength: 8 }, { buffer: 0, byteOffset: 8, byteLength: 24 }, { buffer: 0, byteOffset: 32, byteLength: rot.byteLength }],
      accessors: [
        { bufferView: 0, componentType: 5126, count: 2, type: 'SCALAR', min: [0], max: [1] },
        { bufferView: 1, componentType: 5126, count: 2, type: 'VEC3' },
        { bufferView: 2, componentType: rotType, normalized: true, count: 2, type: 'VEC4' },
      ],
      animations: [{ samplers: [{ input: 0, output: 1 }, { input: 0, output: 2, interpolation: 'STEP' }], channels: [
        { sampler: 0, target: { node: 0, path: 'translation' } }, { sampler: 1, target: { node: 0, path: 'rotation' } }] }],
    };
    return { json, bin };
  }

  it('names curves <node>/<path>/<component>, reads external .bin, decodes normalized integers (§3.11)', () => {
    const { json, bin } = handMade();
    const imp = readGltf(JSON.stringify(json), (uri) => { expect(uri).toBe('crate.bin'); return bin; });
    expect(imp.curves.map((c) => c.name)).toEqual(['crate/translation/0', 'crate/translation/1', 'crate/translation/2',
      'crate/rotation/0', 'crate/rotation/1', 'crate/rotation/2', 'crate/rotation/3']);
    expect(imp.curves[1].keys.map((k) => k.value)).toEqual([1, 4]);
    expect(imp.curves[1].segments).toEqual([{ kind: 'linear' }]);
    // glTF 2.0 §3.11: SHORT normalized decodes as max(c/32767, −1): −32768 → −1, 16384 → 16384/32767
    expect(imp.curves[3].keys.map((k) => k.value)).toEqual([0, -1]);
    expect(imp.curves[4].keys[1].value).toBe(16384 / 32767);
    expect(imp.curves[6].keys[0].value).toBe(1);
    expect(imp.curves[3].segments).toEqual([{ kind: 'step' }]);
    // BYTE normalized: max(c/127, −1)
    const b = handMade({ rotationType: 5120 });
    const imp2 = readGltf(b.json, () => b.bin);
    expect(imp2.curves[3].keys[1].value).toBe(-1);
    expect(imp2.curves[4].keys[1].value).toBe(64 / 127);
    // a data: URI buffer of the same bytes reads the same
    const inline = { ...b.json, buffers: [{ byteLength: b.bin.length, uri: 'data:application/octet-stream;base64,' + encodeBase64(b.bin) }] };
    expect(readGltf(inline).curves[4].keys[1].value).toBe(64 / 127);
  });

  it('UNSIGNED_BYTE / UNSIGNED_SHORT normalized weights decode as c/255 and c/65535', () => {
    const times = new Float32Array([0, 1]);
    const ub = new Uint8Array([0, 255, 51, 128]); // 2 keys × 2 morph targets
    const us = new Uint16Array([65535, 0]);
    const bin = new Uint8Array(16);
    bin.set(new Uint8Array(times.buffer), 0); bin.set(ub, 8); bin.set(new Uint8Array(us.buffer), 12);
    const json = {
      asset: { version: '2.0' }, nodes: [{ name: 'a' }, { name: 'b' }],
      buffers: [{ byteLength: 16, uri: 'data:application/octet-stream;base64,' + encodeBase64(bin) }],
      bufferViews: [{ buffer: 0, byteOffset: 0, byteLength: 8 }, { buffer: 0, byteOffset: 8, byteLength: 4 }, { buffer: 0, byteOffset: 12, byteLength: 4 }],
      accessors: [{ bufferView: 0, componentType: 5126, count: 2, type: 'SCALAR', min: [0], max: [1] },
        { bufferView: 1, componentType: 5121, normalized: true, count: 4, type: 'SCALAR' },
        { bufferView: 2, componentType: 5123, normalized: true, count: 2, type: 'SCALAR' }],
      animations: [{ samplers: [{ input: 0, output: 1 }, { input: 0, output: 2 }], channels: [
        { sampler: 0, target: { node: 0, path: 'weights' } }, { sampler: 1, target: { node: 1, path: 'weights' } }] }],
    };
    const imp = readGltf(json);
    expect(imp.curves.map((c) => c.name)).toEqual(['a/weights/0', 'a/weights/1', 'b/weights/0']);
    expect(imp.curves[0].keys.map((k) => k.value)).toEqual([0, 51 / 255]);
    expect(imp.curves[1].keys.map((k) => k.value)).toEqual([1, 128 / 255]);
    expect(imp.curves[2].keys.map((k) => k.value)).toEqual([1, 0]);
  });

  it('fails with errors that name what is wrong', () => {
    const { json, bin } = handMade();
    expect(() => readGltf(json)).toThrow(/buffers\[0\]\.uri: external file "crate.bin" needs a resolver/);
    expect(() => readGltf(json, () => { throw new Error('no such file'); })).toThrow(/could not read "crate.bin": no such file/);
    expect(() => readGltf(json, () => bin.subarray(0, 10))).toThrow(/byteLength is 48 but only 10 bytes/);
    const badTimes = structuredClone(json);
    const tb = bin.slice();
    new DataView(tb.buffer).setFloat32(4, 0, true);
    expect(() => readGltf(badTimes, () => tb)).toThrow(/samplers\[0\]\.input: times must be strictly increasing/);
    const badAcc = structuredClone(json);
    badAcc.animations[0].samplers[0].output = 9;
    expect(() => readGltf(badAcc, () => bin)).toThrow(/samplers\[0\]\.output: accessor 9 does not exist/);
    const badCount = structuredClone(json);
    badCount.accessors[1].count = 1;
    expect(() => readGltf(badCount, () => bin)).toThrow(/output: 1 elements do not fit 2 keys/);
    expect(() => readGltf('{"asset": {"version": "1.0"}}')).toThrow(/asset.version: "1.0" is not glTF 2.x/);
    expect(() => readGltf('{not json')).toThrow(/glTF: invalid JSON/);
    expect(() => readGltf(new Uint8Array([0x67, 0x6c, 0x54, 0x46, 1, 0, 0, 0, 20, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0]))).toThrow(/GLB: version 1/);
  });
});
