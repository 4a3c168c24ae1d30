/**
 * glTF 2.0 animation import (Khronos glTF 2.0 specification §3.6 buffers/accessors incl. sparse,
 * §3.11 animations, §4.4 GLB, Appendix C interpolation).
 *
 * Every channel's every output component becomes one curve named `<node name>/<path>/<component>`
 * (a node without a name is `node<index>`; with several animations a repeated name gets `#<animation
 * index>` appended). Per sampler interpolation:
 * - STEP → `step` segments; LINEAR (the default) → `linear` segments;
 * - CUBICSPLINE → `hermite` segments; the key's in-tangent a_k and out-tangent b_k (Appendix C,
 *   value units per second) become slopeIn and slopeOut (`split` when they differ).
 * Normalized integer outputs decode as c/255, c/65535, max(c/127, −1), max(c/32767, −1) (§3.11).
 * Outside the input range glTF holds the end values, so curves get `clamp` before and after.
 * A LINEAR `rotation` channel is slerped by glTF engines; as four component curves it is linear per
 * component, which differs between keys — reported in `warnings`.
 */
import type { CurveDocument, Drives, Key, Segment } from '../curve/types';
import { decodeBase64 } from './base64';
import { decodeUtf8 } from './utf8';

/** Returns the bytes of an external (non-data:) buffer URI, e.g. "scene.bin"; may throw. */
export type GltfResolver = (uri: string) => Uint8Array;

export interface GltfImport {
  curves: CurveDocument[];
  warnings: string[];
}

export class GltfReadError extends Error {}

type Json = Record<string, unknown>;

const COMPONENT: Record<number, { size: number; get: (dv: DataView, o: number) => number; norm: (c: number) => number; name: string }> = {
  5120: { size: 1, get: (dv, o) => dv.getInt8(o), norm: (c) => Math.max(c / 127, -1), name: 'BYTE' },
  5121: { size: 1, get: (dv, o) => dv.getUint8(o), norm: (c) => c / 255, name: 'UNSIGNED_BYTE' },
  5122: { size: 2, get: (dv, o) => dv.getInt16(o, true), norm: (c) => Math.max(c / 32767, -1), name: 'SHORT' },
  5123: { size: 2, get: (dv, o) => dv.getUint16(o, true), norm: (c) => c / 65535, name: 'UNSIGNED_SHORT' },
  5125: { size: 4, get: (dv, o) => dv.getUint32(o, true), norm: (c) => c, name: 'UNSIGNED_INT' },
  5126: { size: 4, get: (dv, o) => dv.getFloat32(o, true), norm: (c) => c, name: 'FLOAT' },
};
const TYPE_SIZE: Record<string, number> = { SCALAR: 1, VEC2: 2, VEC3: 3, VEC4: 4, MAT2: 4, MAT3: 9, MAT4: 16 };

const fail = (msg: string): never => { throw new GltfReadError(msg); };

/** True when the bytes start with the GLB magic "glTF". */
export function isGlb(bytes: Uint8Array): boolean {
  return bytes.length >= 4 && bytes[0] === 0x67 && bytes[1] === 0x6c && bytes[2] === 0x54 && bytes[3] === 0x46;
}

/** Split a GLB (§4.4) into its JSON and optional BIN chunk. */
export function parseGlb(bytes: Uint8Array): { json: Json; bin: Uint8Array | null } {
  if (bytes.length < 20) fail(`GLB: file is ${bytes.length} bytes, shorter than the 12-byte header and one chunk header`);
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (!isGlb(bytes)) fail('GLB: magic is not "glTF"');
  const version = dv.getUint32(4, true);
  if (version !== 2) fail(`GLB: version ${version}, only version 2 is supported`);
  const length = dv.getUint32(8, true);
  if (length > bytes.length) fail(`GLB: header length ${length} exceeds the file size ${bytes.length}`);
  let offset = 12;
  let json: Json | null = null;
  let bin: Uint8Array | null = null;
  while (offset + 8 <= length) {
    const chunkLength = dv.getUint32(offset, true);
    const chunkType = dv.getUint32(offset + 4, true);
    const start = offset + 8;
    if (start + chunkLength > length) fail(`GLB: chunk at byte ${offset} (length ${chunkLength}) runs past the end of the file`);
    const data = bytes.subarray(start, start + chunkLength);
    if (chunkType === 0x4e4f534a) {
      if (json) fail('GLB: more than one JSON chunk');
      let text: string;
      try { text = decodeUtf8(data); } catch (e) { return fail(`GLB JSON chunk: ${(e as Error).message}`); }
      json = parseJsonText(text, 'GLB JSON chunk');
    } else if (chunkType === 0x004e4942) {
      if (!json) fail('GLB: the BIN chunk comes before the JSON chunk');
      if (!bin) bin = data;
    }
    offset = start + chunkLength;
  }
  if (!json) fail('GLB: no JSON chunk');
  return { json: json as Json, bin };
}

function parseJsonText(text: string, where: string): Json {
  let v: unknown;
  try { v = JSON.parse(text); } catch (e) { return fail(`${where}: invalid JSON (${(e as Error).message})`); }
  if (!v || typeof v !== 'object' || Array.isArray(v)) fail(`${where}: the top level must be a JSON object`);
  return v as Json;
}

const arr = (j: Json, key: string, where: string): Json[] => {
  const v = j[key];
  if (v === undefined) return [];
  if (!Array.isArray(v)) return fail(`${where}.${key}: must be an array`);
  return v as Json[];
};
const int = (v: unknown, where: string): number => {
  if (typeof v !== 'number' || !Number.isInteger(v) || v < 0) return fail(`${where}: must be a non-negative integer, got ${JSON.stringify(v)}`);
  return v;
};

/**
 * Read every animation channel of a glTF asset as curves. `input` is a .glb/.gltf file's bytes, a
 * .gltf JSON string, or the parsed JSON object. External buffers are fetched with `resolve`.
 */
export function readGltf(input: Uint8Array | string | object, resolve?: GltfResolver): GltfImport {
  let json: Json;
  let glbBin: Uint8Array | null = null;
  if (input instanceof Uint8Array) {
    if (isGlb(input)) ({ json, bin: glbBin } = parseGlb(input));
    else {
      let text: string;
      try { text = decodeUtf8(input); } catch (e) { return fail(`glTF: not a GLB and not UTF-8 JSON (${(e as Error).message})`); }
      json = parseJsonText(text, 'glTF');
    }
  } else if (typeof input === 'string') json = parseJsonText(input, 'glTF');
  else json = input as Json;

  const asset = json.asset as Json | undefined;
  if (!asset || typeof asset !== 'object') fail('asset: missing (every glTF has asset.version)');
  const version = String((asset as Json).version ?? '');
  if (!/^2\.\d+$/.test(version)) fail(`asset.version: "${version}" is not glTF 2.x`);

  const buffers = arr(json, 'buffers', 'glTF');
  const bufferData: (Uint8Array | null)[] = buffers.map(() => null);
  const bufferBytes = (i: number): Uint8Array => {
    const where = `buffers[${i}]`;
    if (i >= buffers.length) fail(`${where}: does not exist (${buffers.length} buffers)`);
    const cached = bufferData[i];
    if (cached) return cached;
    const b = buffers[i];
    const byteLength = int(b.byteLength, `${where}.byteLength`);
    let data: Uint8Array;
    const uri = b.uri;
    if (uri === undefined) {
      if (i !== 0 || !glbBin) return fail(`${where}: has no uri and there is no GLB BIN chunk`);
      data = glbBin;
    } else if (typeof uri !== 'string') return fail(`${where}.uri: must be a string`);
    else if (uri.startsWith('data:')) {
      const comma = uri.indexOf(',');
      if (comma < 0 || !/;base64$/.test(uri.slice(0, comma))) fail(`${where}.uri: only base64 data: URIs are supported`);
      try { data = decodeBase64(uri.slice(comma + 1)); } catch (e) { return fail(`${where}.uri: ${(e as Error).message}`); }
    } else {
      if (!resolve) return fail(`${where}.uri: external file "${uri}" needs a resolver (none given)`);
      try { data = resolve(decodeURIComponent(uri)); } catch (e) { return fail(`${where}.uri: could not read "${uri}": ${(e as Error).message}`); }
    }
    if (data.length < byteLength) fail(`${where}: byteLength is ${byteLength} but only ${data.length} bytes were found`);
    bufferData[i] = data;
    return data;
  };

  const views = arr(json, 'bufferViews', 'glTF');
  const accessors = arr(json, 'accessors', 'glTF');

  /** Read count elements of n components from a bufferView, starting byteOffset into it. */
  const readRun = (viewIndex: number, byteOffset: number, componentType: number, n: number, count: number, normalized: boolean, where: string): Float64Array => {
    const comp = COMPONENT[componentType];
    if (!comp) fail(`${where}.componentType: ${componentType} is not a glTF component type`);
    if (viewIndex >= views.length) fail(`${where}.bufferView: ${viewIndex} does not exist (${views.length} bufferViews)`);
    const v = views[viewIndex];
    const vw = `bufferViews[${viewIndex}]`;
    const bytes = bufferBytes(int(v.buffer, `${vw}.buffer`));
    const viewOffset = v.byteOffset === undefined ? 0 : int(v.byteOffset, `${vw}.byteOffset`);
    const viewLength = int(v.byteLength, `${vw}.byteLength`);
    const elementSize = comp.size * n;
    const stride = v.byteStride === undefined ? elementSize : int(v.byteStride, `${vw}.byteStride`);
    const need = count === 0 ? 0 : byteOffset + stride * (count - 1) + elementSize;
    if (need > viewLength) fail(`${where}: needs ${need} bytes of ${vw}, which has ${viewLength}`);
    if (viewOffset + viewLength > bytes.length) fail(`${vw}: byteOffset + byteLength = ${viewOffset + viewLength} exceeds its buffer (${bytes.length} bytes)`);
    const dv = new DataView(bytes.buffer, bytes.byteOffset + viewOffset, viewLength);
    const out = new Float64Array(count * n);
    for (let e = 0; e < count; e++) {
      for (let c = 0; c < n; c++) {
        const raw = comp.get(dv, byteOffset + e * stride + c * comp.size);
        out[e * n + c] = normalized ? comp.norm(raw) : raw;
      }
    }
    return out;
  };

  const readAccessor = (index: number, where: string): { data: Float64Array; n: number; count: number; json: Json } => {
    if (index >= accessors.length) fail(`${where}: accessor ${index} does not exist (${accessors.length} accessors)`);
    const a = accessors[index];
    const aw = `accessors[${index}]`;
    const n = TYPE_SIZE[String(a.type)];
    if (!n) fail(`${aw}.type: "${String(a.type)}" is not a glTF accessor type`);
    const count = int(a.count, `${aw}.count`);
    const componentType = Number(a.componentType);
    const normalized = a.normalized === true;
    let data: Float64Array;
    if (a.bufferView === undefined) data = new Float64Array(count * n);
    else data = readRun(int(a.bufferView, `${aw}.bufferView`), a.byteOffset === undefined ? 0 : int(a.byteOffset, `${aw}.byteOffset`), componentType, n, count, normalized, aw);
    const sparse = a.sparse as Json | undefined;
    if (sparse) {
      const sw = `${aw}.sparse`;
      const sc = int(sparse.count, `${sw}.count`);
      const si = sparse.indices as Json;
      const sv = sparse.values as Json;
      if (!si || !sv) fail(`${sw}: needs indices and values`);
      const idx = readRun(int(si.bufferView, `${sw}.indices.bufferView`), si.byteOffset === undefined ? 0 : int(si.byteOffset, `${sw}.indices.byteOffset`), Number(si.componentType), 1, sc, false, `${sw}.indices`);
      const vals = readRun(int(sv.bufferView, `${sw}.values.bufferView`), sv.byteOffset === undefined ? 0 : int(sv.byteOffset, `${sw}.values.byteOffset`), componentType, n, sc, normalized, `${sw}.values`);
      for (let s = 0; s < sc; s++) {
        const e = idx[s];
        if (e >= count) fail(`${sw}.indices[${s}]: ${e} is not below count ${count}`);
        for (let c = 0; c < n; c++) data[e * n + c] = vals[s * n + c];
      }
    }
    return { data, n, count, json: a };
  };

  const nodes = arr(json, 'nodes', 'glTF');
  const animations = arr(json, 'animations', 'glTF');
  const curves: CurveDocument[] = [];
  const warnings: string[] = [];
  const used = new Set<string>();

  animations.forEach((anim, ai) => {
    const aw = `animations[${ai}]`;
    const samplers = arr(anim, 'samplers', aw);
    arr(anim, 'channels', aw).forEach((ch, ci) => {
      const cw = `${aw}.channels[${ci}]`;
      const target = ch.target as Json | undefined;
      if (!target || typeof target !== 'object') fail(`${cw}.target: missing`);
      const path = String((target as Json).path);
      if ((target as Json).node === undefined) {
        warnings.push(`${cw}: no target node (path "${path}"), skipped`);
        return;
      }
      const nodeIndex = int((target as Json).node, `${cw}.target.node`);
      if (nodeIndex >= nodes.length) fail(`${cw}.target.node: ${nodeIndex} does not exist (${nodes.length} nodes)`);
      const node = nodes[nodeIndex];
      const nodeName = typeof node.name === 'string' && node.name.trim() !== '' ? node.name : `node${nodeIndex}`;
      const si = int(ch.sampler, `${cw}.sampler`);
      if (si >= samplers.length) fail(`${cw}.sampler: ${si} does not exist (${samplers.length} samplers)`);
      const sampler = samplers[si];
      const sw = `${aw}.samplers[${si}]`;
      const interpolation = sampler.interpolation === undefined ? 'LINEAR' : String(sampler.interpolation);
      if (interpolation !== 'STEP' && interpolation !== 'LINEAR' && interpolation !== 'CUBICSPLINE') {
        fail(`${sw}.interpolation: "${interpolation}" is not STEP, LINEAR or CUBICSPLINE`);
      }
      const inp = readAccessor(int(sampler.input, `${sw}.input`), `${sw}.input`);
      if (inp.n !== 1) fail(`${sw}.input: accessor must be SCALAR (times), got ${String(inp.json.type)}`);
      const times = inp.data;
      const K = times.length;
      if (K === 0) fail(`${sw}.input: has no keys`);
      for (let k = 0; k < K; k++) {
        if (!Number.isFinite(times[k])) fail(`${sw}.input: time ${k} is not finite`);
        if (k > 0 && !(times[k] > times[k - 1])) fail(`${sw}.input: times must be strictly increasing, but time ${k} (${times[k]}) ≤ time ${k - 1} (${times[k - 1]})`);
      }
      const cubic = interpolation === 'CUBICSPLINE';
      if (cubic && K < 2) fail(`${sw}: CUBICSPLINE needs at least 2 keys, got ${K}`);
      const out = readAccessor(int(sampler.output, `${sw}.output`), `${sw}.output`);
      const perKey = cubic ? 3 : 1;
      if (out.count % (K * perKey) !== 0) {
        fail(`${sw}.output: ${out.count} elements do not fit ${K} keys × ${perKey}${cubic ? ' (in-tangent, value, out-tangent)' : ''}`);
      }
      // components per key: the element size, or for weights the number of morph targets
      const elementsPerKey = out.count / (K * perKey);
      const comps = elementsPerKey * out.n;
      if (path === 'weights' && out.n !== 1) fail(`${sw}.output: weights output must be SCALAR`);
      if (path !== 'weights' && elementsPerKey !== 1) fail(`${sw}.output: ${out.count} elements for ${K} keys (expected ${K * perKey})`);
      if (path === 'rotation' && interpolation === 'LINEAR') {
        warnings.push(`${cw}: LINEAR rotation is spherical (slerp) in glTF; the component curves of ${nodeName}/rotation interpolate each component linearly`);
      }
      const drives: Drives = path === 'translation' ? 'position' : path === 'rotation' ? 'rotation' : path === 'scale' ? 'scale' : 'other';
      const unit = path === 'translation' ? 'm' : path === 'rotation' ? 'quaternion' : '';
      for (let c = 0; c < comps; c++) {
        // element e of key k, component c: output[(k·perKey + part)·comps + c]
        const at = (k: number, part: number) => out.data[(k * perKey + part) * comps + c];
        const keys: Key[] = [];
        for (let k = 0; k < K; k++) {
          const value = cubic ? at(k, 1) : at(k, 0);
          const slopeIn = cubic ? at(k, 0) : 0;
          const slopeOut = cubic ? at(k, 2) : 0;
          keys.push({ time: times[k], value, slopeIn, slopeOut, rule: 'manual', slopes: slopeIn === slopeOut ? 'joined' : 'split' });
        }
        if (interpolation === 'LINEAR') {
          for (let k = 0; k < K; k++) {
            // slopes of linear keys: the secants (used only by `extend`; glTF clamps)
            if (k > 0) keys[k].slopeIn = (keys[k].value - keys[k - 1].value) / (times[k] - times[k - 1]);
            if (k + 1 < K) keys[k].slopeOut = (keys[k + 1].value - keys[k].value) / (times[k + 1] - times[k]);
          }
          for (const key of keys) {
            if (K > 1 && key === keys[0]) key.slopeIn = key.slopeOut;
            if (K > 1 && key === keys[K - 1]) key.slopeOut = key.slopeIn;
            key.slopes = key.slopeIn === key.slopeOut ? 'joined' : 'split';
          }
        }
        const kind: Segment['kind'] = interpolation === 'STEP' ? 'step' : interpolation === 'LINEAR' ? 'linear' : 'hermite';
        let name = `${nodeName}/${path}/${c}`;
        if (used.has(name)) name = `${name}#${ai}`;
        let suffix = 2;
        while (used.has(name)) name = `${nodeName}/${path}/${c}#${ai}.${suffix++}`;
        used.add(name);
        curves.push({
          format: 'tangentry.curve',
          version: 1,
          name,
          description: `Imported from glTF ${aw}${typeof anim.name === 'string' ? ` "${anim.name}"` : ''}, channel ${ci}, ${interpolation}`,
          units: { time: 's', value: unit },
          before: 'clamp',
          after: 'clamp',
          frameRate: 60,
          drives,
          tags: ['gltf'],
          keys,
          segments: keys.slice(1).map(() => ({ kind })),
        });
      }
    });
  });
  if (curves.length === 0) warnings.push('the asset has no animation channels');
  return { curves, warnings };
}
