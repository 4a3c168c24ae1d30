// Tests for shared/convert/gltf-write.ts against Khronos gltf-validator 2.0.0-dev.3.10 and
// three.js 0.187.0 GLTFLoader (see /work/shared/REFERENCES.md, "glTF 2.0").
import { describe, expect, it } from 'vitest';
import validator from 'gltf-validator';
import { writeGltf, type GltfTrack } from '../../../shared/convert/gltf-write';
import { loadWithThree, threeSample } from './three-helper';

const tracks: GltfTrack[] = [
  { name: 'panel-slide', interpolation: 'LINEAR', times: new Float32Array([0, 0.5, 1.25]), output: new Float32Array([0, 1, -0.5]) },
  { name: 'button-squash', interpolation: 'STEP', times: new Float32Array([0.1, 0.2, 0.4]), output: new Float32Array([1, 2, 3]) },
  {
    name: 'jump/arc', interpolation: 'CUBICSPLINE', times: new Float32Array([0, 0.4, 1]),
    // in-tangent, value, out-tangent per key (glTF 2.0 Appendix C)
    output: new Float32Array([0, 0, 3, -1, 1, 2, -4, 0.25, 0]),
  },
];

/** glTF 2.0 Appendix C cubic spline, written independently from the spec text. */
function appendixC(t: number, times: Float32Array, out: Float32Array): number {
  const n = times.length;
  if (t <= times[0]) return out[1];
  if (t >= times[n - 1]) return out[3 * (n - 1) + 1];
  let k = 0;
  while (t >= times[k + 1]) k++;
  const td = times[k + 1] - times[k];
  const s = (t - times[k]) / td;
  const vk = out[3 * k + 1], bk = out[3 * k + 2], vk1 = out[3 * (k + 1) + 1], ak1 = out[3 * (k + 1)];
  return (2 * s ** 3 - 3 * s ** 2 + 1) * vk + td * (s ** 3 - 2 * s ** 2 + s) * bk
    + (-2 * s ** 3 + 3 * s ** 2) * vk1 + td * (s ** 3 - s ** 2) * ak1;
}

describe('writeGltf', () => {
  it('gltf-validator reports 0 errors for the .gltf and the .glb', async () => {
    const asset = writeGltf(tracks);
    const gltfBytes = new TextEncoder().encode(JSON.stringify(asset.json));
    // gltf-validator 2.0.0-dev.3.10 validateBytes (REFERENCES.md)
    const r1 = await validator.validateBytes(gltfBytes, { format: 'gltf', writeTimestamp: false });
    expect(r1.issues.numErrors, JSON.stringify(r1.issues.messages)).toBe(0);
    expect(r1.issues.numWarnings, JSON.stringify(r1.issues.messages)).toBe(0);
    const r2 = await validator.validateBytes(asset.glb(), { format: 'glb', writeTimestamp: false });
    expect(r2.issues.numErrors, JSON.stringify(r2.issues.messages)).toBe(0);
  });

  it('three.js GLTFLoader evaluates every track as the written data says (float32 precision)', async () => {
    const asset = writeGltf(tracks);
    for (const input of [JSON.stringify(asset.json), asset.glb().slice().buffer]) {
      const clip = await loadWithThree(input);
      expect(clip.tracks.length).toBe(3);
      for (let j = 0; j < 3; j++) {
        const tr = tracks[j];
        for (let t = 0; t <= 1.4; t += 0.01) {
          const got = threeSample(clip.tracks[j], t);
          let want: number;
          if (tr.interpolation === 'CUBICSPLINE') want = appendixC(t, tr.times, tr.output);
          else if (tr.interpolation === 'STEP') {
            // glTF 2.0 §3.11 STEP: value of the key at or before t, clamped outside the input range
            let k = 0;
            while (k + 1 < tr.times.length && t >= tr.times[k + 1]) k++;
            want = tr.output[k];
          } else {
            const x = tr.times;
            if (t <= x[0]) want = tr.output[0];
            else if (t >= x[x.length - 1]) want = tr.output[x.length - 1];
            else {
              let k = 0;
              while (t >= x[k + 1]) k++;
              const s = (t - x[k]) / (x[k + 1] - x[k]);
              want = tr.output[k] + s * (tr.output[k + 1] - tr.output[k]);
            }
          }
          expect(Math.abs(got - want)).toBeLessThanOrEqual(1e-6 * Math.max(1, Math.abs(want)));
        }
      }
    }
  });

  it('names nodes by the track name and embeds a data: URI buffer', () => {
    const { json } = writeGltf(tracks);
    expect(json.nodes.map((n) => n.name)).toEqual(['panel-slide', 'button-squash', 'jump/arc']);
    expect(json.buffers[0].uri?.startsWith('data:application/octet-stream;base64,')).toBe(true);
    expect(json.accessors[2].min).toEqual([0]);
    expect(json.accessors[2].max).toEqual([1.25]);
  });

  it('rejects bad tracks with an error naming the track and field', () => {
    expect(() => writeGltf([{ ...tracks[0], times: new Float32Array([0, 0.5, 0.5]) }])).toThrow(/tracks\[0\].*times\[2\].*strictly increasing/);
    expect(() => writeGltf([{ ...tracks[0], times: new Float32Array([-1, 0, 1]) }])).toThrow(/times\[0\].*≥ 0/);
    expect(() => writeGltf([{ ...tracks[2], output: new Float32Array(4) }])).toThrow(/output: expected 9/);
    expect(() => writeGltf([{ name: 'x', interpolation: 'CUBICSPLINE', times: new Float32Array([0]), output: new Float32Array(3) }])).toThrow(/at least two keys/);
    expect(() => writeGltf([])).toThrow(/at least one track/);
  });
});
