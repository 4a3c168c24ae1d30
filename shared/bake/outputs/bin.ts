/**
 * Binary pack writer and reader. Format (little-endian) in docs/runtime-format.md:
 *   header 32 B | directory 48 B per curve | names (UTF-8, NUL-terminated) | data blocks (16-byte aligned) | CRC-32
 */
import type { Table } from '../table';
import { ENCODING_BYTES, ENCODING_CODE } from '../encoding';
import { crc32 } from '../crc32';
import { encodeUtf8, decodeUtf8 } from '../../convert/utf8';
import type { Encoding, Kernel, Layout } from '../profile';

export const PACK_MAGIC = 0x4b504754; // "TGPK" read as a little-endian u32
export const PACK_VERSION = 1;
export const HEADER_BYTES = 32;
export const DIRECTORY_ENTRY_BYTES = 48;

const align = (x: number, a: number) => Math.ceil(x / a) * a;

export interface PackCurve { name: string; table: Table }

function codeBytes(codes: Float32Array | Uint16Array | Uint8Array): Uint8Array {
  // little-endian bytes of the codes (DataView so the host's byte order never matters)
  const bpe = codes.BYTES_PER_ELEMENT;
  const out = new Uint8Array(codes.length * bpe);
  const dv = new DataView(out.buffer);
  for (let i = 0; i < codes.length; i++) {
    if (codes instanceof Float32Array) dv.setFloat32(4 * i, codes[i], true);
    else if (bpe === 2) dv.setUint16(2 * i, codes[i], true);
    else out[i] = codes[i];
  }
  return out;
}

/** Write a pack; byte-identical for identical input. */
export function writePack(curves: readonly PackCurve[]): Uint8Array {
  const names = curves.map((c) => encodeUtf8(c.name));
  const dirOff = HEADER_BYTES;
  const strOff = dirOff + DIRECTORY_ENTRY_BYTES * curves.length;
  let strLen = 0;
  for (const n of names) strLen += n.length + 1;
  let dataOff = align(strOff + strLen, 16);
  const blocks: { off: number; parts: { off: number; bytes: Uint8Array }[]; len: number }[] = [];
  for (const c of curves) {
    const t = c.table;
    const parts: { off: number; bytes: Uint8Array }[] = [];
    let p = 0;
    const add = (b: Uint8Array) => { parts.push({ off: p, bytes: b }); p = align(p + b.length, 4); };
    if (t.layout === 'adaptive') add(codeBytes(t.timeCodes!));
    add(codeBytes(t.valueCodes));
    if (t.kernel === 'hermite') add(codeBytes(t.slopeCodes!));
    blocks.push({ off: dataOff, parts, len: p });
    dataOff = align(dataOff + p, 16);
  }
  const size = dataOff + 4;
  const out = new Uint8Array(size);
  const dv = new DataView(out.buffer);
  dv.setUint32(0, PACK_MAGIC, true);
  dv.setUint16(4, PACK_VERSION, true);
  dv.setUint16(6, HEADER_BYTES, true);
  dv.setUint32(8, curves.length, true);
  dv.setUint32(12, dirOff, true);
  dv.setUint32(16, strOff, true);
  dv.setUint32(20, strLen, true);
  dv.setUint32(24, size, true);
  dv.setUint32(28, 0, true);
  let s = strOff;
  curves.forEach((c, i) => {
    const t = c.table;
    const e = dirOff + DIRECTORY_ENTRY_BYTES * i;
    dv.setUint32(e + 0, s, true);
    dv.setUint32(e + 4, names[i].length, true);
    out.set(names[i], s);
    s += names[i].length + 1;
    out[e + 8] = t.kernel === 'hermite' ? 1 : 0;
    out[e + 9] = t.layout === 'adaptive' ? 1 : 0;
    out[e + 10] = ENCODING_CODE[t.encoding];
    out[e + 11] = 0;
    dv.setUint32(e + 12, t.count, true);
    dv.setFloat32(e + 16, t.start, true);
    dv.setFloat32(e + 20, t.end, true);
    dv.setFloat32(e + 24, t.valueOffset, true);
    dv.setFloat32(e + 28, t.valueScale, true);
    dv.setFloat32(e + 32, t.slopeOffset, true);
    dv.setFloat32(e + 36, t.slopeScale, true);
    dv.setUint32(e + 40, blocks[i].off, true);
    dv.setUint32(e + 44, blocks[i].len, true);
    for (const part of blocks[i].parts) out.set(part.bytes, blocks[i].off + part.off);
  });
  dv.setUint32(size - 4, crc32(out, 0, size - 4), true);
  return out;
}

export interface ReadCurve {
  name: string; kernel: Kernel; layout: Layout; encoding: Encoding; count: number;
  start: number; end: number; valueOffset: number; valueScale: number; slopeOffset: number; slopeScale: number;
  times: Float32Array | null; valueCodes: Float32Array | Uint16Array | Uint8Array; slopeCodes: Float32Array | Uint16Array | Uint8Array | null;
}

const ENCODINGS: Encoding[] = ['f32', 'f16', 'unorm16', 'unorm8'];

/** Read and verify a pack; throws an Error naming the field that is wrong. */
export function readPack(bytes: Uint8Array): ReadCurve[] {
  if (bytes.length < HEADER_BYTES + 4) throw new Error('pack: shorter than the 32-byte header');
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (dv.getUint32(0, true) !== PACK_MAGIC) throw new Error('pack.magic: not "TGPK"');
  if (dv.getUint16(4, true) !== PACK_VERSION) throw new Error(`pack.version: ${dv.getUint16(4, true)} is not supported`);
  const size = dv.getUint32(24, true);
  if (size !== bytes.length) throw new Error(`pack.fileSize: header says ${size}, got ${bytes.length} bytes`);
  if (dv.getUint32(size - 4, true) !== crc32(bytes, 0, size - 4)) throw new Error('pack.crc32: checksum mismatch');
  const n = dv.getUint32(8, true), dir = dv.getUint32(12, true);
  const out: ReadCurve[] = [];
  for (let i = 0; i < n; i++) {
    const e = dir + DIRECTORY_ENTRY_BYTES * i;
    const so = dv.getUint32(e, true), sl = dv.getUint32(e + 4, true);
    const kernel: Kernel = bytes[e + 8] ? 'hermite' : 'linear';
    const layout: Layout = bytes[e + 9] ? 'adaptive' : 'uniform';
    const encoding = ENCODINGS[bytes[e + 10]];
    if (!encoding) throw new Error(`pack.directory[${i}].encoding: unknown code ${bytes[e + 10]}`);
    const count = dv.getUint32(e + 12, true);
    let p = dv.getUint32(e + 40, true);
    const read = (enc: Encoding | 'time') => {
      const bpe = enc === 'time' ? 4 : ENCODING_BYTES[enc];
      const arr = enc === 'time' || enc === 'f32' ? new Float32Array(count) : bpe === 2 ? new Uint16Array(count) : new Uint8Array(count);
      for (let k = 0; k < count; k++) {
        arr[k] = bpe === 4 ? dv.getFloat32(p + 4 * k, true) : bpe === 2 ? dv.getUint16(p + 2 * k, true) : bytes[p + k];
      }
      p = align(p + bpe * count, 4);
      return arr;
    };
    const times = layout === 'adaptive' ? (read('time') as Float32Array) : null;
    const valueCodes = read(encoding);
    const slopeCodes = kernel === 'hermite' ? read(encoding) : null;
    out.push({
      name: decodeUtf8(bytes.subarray(so, so + sl)), kernel, layout, encoding, count,
      start: dv.getFloat32(e + 16, true), end: dv.getFloat32(e + 20, true),
      valueOffset: dv.getFloat32(e + 24, true), valueScale: dv.getFloat32(e + 28, true),
      slopeOffset: dv.getFloat32(e + 32, true), slopeScale: dv.getFloat32(e + 36, true),
      times, valueCodes, slopeCodes,
    });
  }
  return out;
}
