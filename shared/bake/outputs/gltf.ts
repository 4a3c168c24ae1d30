/**
 * glTF 2.0 output through ../../convert/gltf-write.ts: linear kernel → LINEAR sampler, hermite →
 * CUBICSPLINE (in-tangent, value, out-tangent per key, per second; glTF 2.0 Appendix C). glTF input
 * times must be ≥ 0 and strictly increasing, so a jump (repeated time t) keeps its later entry at t and
 * moves the earlier one to the float32 just below t: every float32 time still sees the source's side.
 */
import { writeGltf, type GltfTrack, type GltfWritten } from '../../convert/gltf-write';
import { nextDownF32 } from '../encoding';
import { logicalEntries } from './entries';
import type { PackCurve } from './bin';

export function gltfTrack({ name, table }: PackCurve): GltfTrack {
  const e = logicalEntries(table);
  const n = e.times.length;
  const times = new Float32Array(n);
  for (let k = 0; k < n; k++) {
    let t = Math.fround(e.times[k]);
    if (k + 1 < n && Math.fround(e.times[k + 1]) === t) t = nextDownF32(t);
    if (t < 0) throw new Error(`curve "${name}": glTF needs times ≥ 0, the table starts at ${e.times[0]} s`);
    if (k > 0 && !(t > times[k - 1])) throw new Error(`curve "${name}": entries at ${e.times[k - 1]} s and ${e.times[k]} s are too close for glTF's strictly increasing times`);
    times[k] = t;
  }
  if (table.kernel === 'linear') return { name, interpolation: 'LINEAR', times, output: Float32Array.from(e.values) };
  const output = new Float32Array(3 * n);
  for (let k = 0; k < n; k++) {
    output[3 * k] = e.slopesIn[k];
    output[3 * k + 1] = e.values[k];
    output[3 * k + 2] = e.slopesOut[k];
  }
  return { name, interpolation: 'CUBICSPLINE', times, output };
}

export function writeGltfPack(curves: readonly PackCurve[]): GltfWritten {
  return writeGltf(curves.map(gltfTrack), { generator: 'Tangentry baker' });
}
