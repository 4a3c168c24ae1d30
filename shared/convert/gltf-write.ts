/**
 * Low-level glTF 2.0 animation writer (Khronos glTF 2.0 specification, §3.11 "Animations",
 * §4.4 "GLB File Format", Appendix C "Animation Sampler Interpolation Modes").
 *
 * Layout of the asset (chosen so gltf-validator reports 0 errors and every track is a scalar):
 * - one mesh, "tangentry-carrier": a single triangle (POSITION) with ONE morph target and
 *   default weights [0]. Every node instances that mesh.
 * - one node per track; the node's name is the track name verbatim. A track drives the node's
 *   morph `weights` (path "weights", one component), so importing the asset again yields the
 *   curve `<track name>/weights/0` (see gltf-read.ts).
 * - one animation with one sampler and one channel per track.
 * - input accessor: FLOAT SCALAR seconds with `min`/`max` (glTF 2.0 §3.11: MUST);
 *   output accessor: FLOAT SCALAR; CUBICSPLINE output holds 3 elements per key,
 *   in-tangent a_k, value v_k, out-tangent b_k (Appendix C), tangents in value units per second.
 * - all binary data in one buffer; `json` embeds it as a data: URI (base64), `glb()` writes the
 *   binary container with the buffer as its BIN chunk. Numbers are little-endian (DataView).
 */
import { encodeBase64 } from './base64';
import { encodeUtf8 } from './utf8';

export type GltfInterpolation = 'STEP' | 'LINEAR' | 'CUBICSPLINE';

export interface GltfTrack {
  /** Node name; also the curve name prefix on import (`<name>/weights/0`). */
  name: string;
  interpolation: GltfInterpolation;
  /** Key times in seconds: t0 ≥ 0, strictly increasing, finite (glTF 2.0 §3.11). */
  times: Float32Array;
  /** One value per key (STEP, LINEAR) or three per key: in-tangent, value, out-tangent (CUBICSPLINE). */
  output: Float32Array;
}

export interface GltfWriteOptions {
  /** `asset.generator`; default "Tangentry". */
  generator?: string;
  /** Name of the single animation; default "tangentry". */
  animationName?: string;
}

export interface GltfWritten {
  /** The glTF JSON with one buffer as a data: URI. */
  json: GltfJson;
  /** The same asset as binary glTF (GLB, version 2). */
  glb(): Uint8Array;
}

/** The subset of the glTF JSON schema this writer emits. */
export interface GltfJson {
  asset: { version: '2.0'; generator: string };
  scene: number;
  scenes: { nodes: number[] }[];
  nodes: { name: string; mesh: number }[];
  meshes: { name: string; primitives: { attributes: { POSITION: number }; targets: { POSITION: number }[] }[]; weights: number[] }[];
  buffers: { byteLength: number; uri?: string }[];
  bufferViews: { buffer: number; byteOffset: number; byteLength: number; target?: number }[];
  accessors: {
    bufferView: number; componentType: 5126; count: number; type: 'SCALAR' | 'VEC3'; min?: number[]; max?: number[];
  }[];
  animations: {
    name: string;
    samplers: { input: number; output: number; interpolation: GltfInterpolation }[];
    channels: { sampler: number; target: { node: number; path: 'weights' } }[];
  }[];
}

const FLOAT = 5126;
const ARRAY_BUFFER = 34962;

/** Check one track; throws an Error naming the track and the field. */
function checkTrack(track: GltfTrack, index: number): void {
  const where = `tracks[${index}] ("${track.name}")`;
  if (typeof track.name !== 'string') throw new Error(`${where}.name: must be a string`);
  if (track.interpolation !== 'STEP' && track.interpolation !== 'LINEAR' && track.interpolation !== 'CUBICSPLINE') {
    throw new Error(`${where}.interpolation: must be STEP, LINEAR or CUBICSPLINE, got ${String(track.interpolation)}`);
  }
  const n = track.times.length;
  if (n < 1) throw new Error(`${where}.times: needs at least one key`);
  if (track.interpolation === 'CUBICSPLINE' && n < 2) {
    throw new Error(`${where}.times: CUBICSPLINE needs at least two keys (glTF 2.0 Appendix C), got ${n}`);
  }
  for (let i = 0; i < n; i++) {
    const t = track.times[i];
    if (!Number.isFinite(t)) throw new Error(`${where}.times[${i}]: must be finite, got ${t}`);
    if (t < 0) throw new Error(`${where}.times[${i}]: must be ≥ 0 (glTF 2.0 §3.11), got ${t}`);
    if (i > 0 && !(t > track.times[i - 1])) {
      throw new Error(`${where}.times[${i}]: must be greater than times[${i - 1}] = ${track.times[i - 1]} (strictly increasing), got ${t}`);
    }
  }
  const per = track.interpolation === 'CUBICSPLINE' ? 3 : 1;
  if (track.output.length !== n * per) {
    throw new Error(`${where}.output: expected ${n * per} numbers (${per} per key × ${n} keys), got ${track.output.length}`);
  }
  for (let i = 0; i < track.output.length; i++) {
    if (!Number.isFinite(track.output[i])) throw new Error(`${where}.output[${i}]: must be finite, got ${track.output[i]}`);
  }
}

/** Write the tracks as one glTF 2.0 asset. Throws (naming the track and field) before building anything. */
export function writeGltf(tracks: readonly GltfTrack[], opts: GltfWriteOptions = {}): GltfWritten {
  if (tracks.length === 0) throw new Error('tracks: at least one track is needed');
  tracks.forEach(checkTrack);

  // Byte layout: [carrier positions 36][morph target 36] then per track [times][output].
  const carrierPositions = new Float32Array([0, 0, 0, 1, 0, 0, 0, 1, 0]);
  const morphTarget = new Float32Array([0, 0, 1, 0, 0, 1, 0, 0, 1]);
  const arrays: Float32Array[] = [carrierPositions, morphTarget];
  for (const tr of tracks) arrays.push(tr.times, tr.output);

  let byteLength = 0;
  const bufferViews: GltfJson['bufferViews'] = [];
  arrays.forEach((a, i) => {
    const view: GltfJson['bufferViews'][number] = { buffer: 0, byteOffset: byteLength, byteLength: a.byteLength };
    if (i < 2) view.target = ARRAY_BUFFER;
    bufferViews.push(view);
    byteLength += a.byteLength; // every array is float32, so offsets stay 4-byte aligned
  });

  const bytes = new Uint8Array(byteLength);
  const dv = new DataView(bytes.buffer);
  let offset = 0;
  for (const a of arrays) {
    for (let i = 0; i < a.length; i++, offset += 4) dv.setFloat32(offset, a[i], true);
  }

  const accessors: GltfJson['accessors'] = [
    { bufferView: 0, componentType: FLOAT, count: 3, type: 'VEC3', min: [0, 0, 0], max: [1, 1, 0] },
    { bufferView: 1, componentType: FLOAT, count: 3, type: 'VEC3', min: [0, 0, 1], max: [0, 0, 1] },
  ];
  const samplers: GltfJson['animations'][number]['samplers'] = [];
  const channels: GltfJson['animations'][number]['channels'] = [];
  tracks.forEach((tr, i) => {
    const inputIndex = accessors.length;
    accessors.push({
      bufferView: 2 + 2 * i,
      componentType: FLOAT,
      count: tr.times.length,
      type: 'SCALAR',
      // min/max MUST be present on animation inputs; Math.fround keeps them equal to the stored floats.
      min: [Math.fround(tr.times[0])],
      max: [Math.fround(tr.times[tr.times.length - 1])],
    });
    accessors.push({ bufferView: 3 + 2 * i, componentType: FLOAT, count: tr.output.length, type: 'SCALAR' });
    samplers.push({ input: inputIndex, output: inputIndex + 1, interpolation: tr.interpolation });
    channels.push({ sampler: i, target: { node: i, path: 'weights' } });
  });

  const json: GltfJson = {
    asset: { version: '2.0', generator: opts.generator ?? 'Tangentry' },
    scene: 0,
    scenes: [{ nodes: tracks.map((_, i) => i) }],
    nodes: tracks.map((tr) => ({ name: tr.name, mesh: 0 })),
    meshes: [{
      name: 'tangentry-carrier',
      primitives: [{ attributes: { POSITION: 0 }, targets: [{ POSITION: 1 }] }],
      weights: [0],
    }],
    buffers: [{ byteLength, uri: 'data:application/octet-stream;base64,' + encodeBase64(bytes) }],
    bufferViews,
    accessors,
    animations: [{ name: opts.animationName ?? 'tangentry', samplers, channels }],
  };

  return {
    json,
    glb: () => writeGlb(json, bytes),
  };
}

/**
 * GLB container (glTF 2.0 §4.4): 12-byte header (magic "glTF", version 2, total length),
 * a JSON chunk padded with spaces (0x20) to 4 bytes, a BIN chunk padded with zeros.
 * The buffer in the JSON chunk has no `uri`: it refers to the BIN chunk.
 */
export function writeGlb(json: GltfJson, bin: Uint8Array): Uint8Array {
  const { uri: _uri, ...buffer0 } = json.buffers[0];
  const glbJson = { ...json, buffers: [buffer0, ...json.buffers.slice(1)] };
  const jsonBytes = encodeUtf8(JSON.stringify(glbJson));
  const jsonLen = (jsonBytes.length + 3) & ~3;
  const binLen = (bin.length + 3) & ~3;
  const total = 12 + 8 + jsonLen + 8 + binLen;
  const out = new Uint8Array(total);
  const dv = new DataView(out.buffer);
  dv.setUint32(0, 0x46546c67, true); // "glTF"
  dv.setUint32(4, 2, true);
  dv.setUint32(8, total, true);
  dv.setUint32(12, jsonLen, true);
  dv.setUint32(16, 0x4e4f534a, true); // "JSON"
  out.set(jsonBytes, 20);
  out.fill(0x20, 20 + jsonBytes.length, 20 + jsonLen);
  const binStart = 20 + jsonLen;
  dv.setUint32(binStart, binLen, true);
  dv.setUint32(binStart + 4, 0x004e4942, true); // "BIN\0"
  out.set(bin, binStart + 8);
  return out;
}
