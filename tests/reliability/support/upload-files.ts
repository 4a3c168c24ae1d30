/**
 * fast-check arbitraries for bad bulk uploads (multipart parts for POST …/packs/:pack/uploads): random
 * bytes under accepted and refused extensions, CSV with broken rows, JSON that is almost a curve
 * document, .glb files with a broken header, and tolerance values that are not positive numbers.
 * Each file says what it is (`kind`) so a failing run names the case.
 */
import fc from 'fast-check';
import { NAN_LIKE, oneFieldWrong } from './bad-values';
import { parseCurveDocument } from '../../../shared/curve/schema';

export interface BadFile { kind: string; name: string; bytes: Buffer }

const stem = fc.stringMatching(/^[a-z][a-z0-9-]{0,11}$/);

/** Random bytes under an accepted extension (.csv .json .gltf .glb) or a refused one. */
export const randomBytesFile: fc.Arbitrary<BadFile> = fc
  .tuple(stem, fc.constantFrom('.csv', '.json', '.gltf', '.glb', '.txt', '.exe', '.fbx', '.CSV.bak', '', '.json.', '.tar.gz'), fc.uint8Array({ maxLength: 2048 }))
  .map(([s, ext, bytes]) => ({ kind: `random bytes ${ext || '(no extension)'}`, name: `${s}${ext}`, bytes: Buffer.from(bytes) }));

/** A cell that breaks a numeric time,value row. */
const badCell = fc.oneof(fc.constantFrom(...NAN_LIKE, 'half', '"1', '1;2', '\u0000', '1e999', ' 1 2 '), fc.string({ maxLength: 6 }));
const goodRow = fc.tuple(fc.double({ min: 0, max: 10, noNaN: true }), fc.double({ min: -5, max: 5, noNaN: true })).map(([a, b]) => `${a},${b}`);
const brokenRow = fc.oneof(
  fc.tuple(badCell, fc.double({ noNaN: true, min: -1, max: 1 })).map(([a, b]) => `${a},${b}`),
  fc.tuple(fc.double({ noNaN: true, min: 0, max: 1 }), badCell).map(([a, b]) => `${a},${b}`),
  fc.constantFrom('1', '1,2,3,4,5,6', ',', '', '"unterminated,1'),
);

/** A CSV with a header, some good rows and at least one broken row placed anywhere. */
export const brokenCsvFile: fc.Arbitrary<BadFile> = fc
  .tuple(stem, fc.boolean(), fc.array(goodRow, { maxLength: 6 }), fc.array(brokenRow, { minLength: 1, maxLength: 3 }), fc.nat())
  .map(([s, header, good, broken, at]) => {
    const rows = [...good];
    for (const b of broken) rows.splice(at % (rows.length + 1), 0, b);
    return { kind: 'csv with broken rows', name: `${s}.csv`, bytes: Buffer.from(`${header ? 'time,value\n' : ''}${rows.join('\n')}\n`) };
  });

/** A curve document with one field mutated so the shared parser refuses it, as a .json upload. */
export function almostCurveFile(valid: object): fc.Arbitrary<BadFile> {
  return fc
    .tuple(stem, oneFieldWrong(valid).filter((m) => !parseCurveDocument(m.body).ok))
    .map(([s, m]) => ({ kind: `curve json, ${m.path.join('.')} wrong`, name: `${s}.json`, bytes: Buffer.from(JSON.stringify(m.body)) }));
}

/** GLB (glTF 2.0 §4.4 binary container: magic "glTF", version 2, total length, then chunks) with a
 * broken header: wrong magic, wrong version, a length that lies, a missing or bogus JSON chunk. */
export const brokenGlbFile: fc.Arbitrary<BadFile> = fc
  .tuple(
    stem,
    fc.constantFrom('magic', 'version', 'length', 'chunk-type', 'chunk-length', 'truncated', 'json'),
    fc.uint8Array({ minLength: 0, maxLength: 64 }),
    fc.integer({ min: 0, max: 0xffffffff }),
  )
  .map(([s, how, tail, n]) => {
    const json = Buffer.from('{"asset":{"version":"2.0"}}  ');
    const head = Buffer.alloc(20);
    head.write(how === 'magic' ? 'gLTF' : 'glTF', 0, 'latin1');
    head.writeUInt32LE(how === 'version' ? (n % 7 === 2 ? 3 : n % 7) : 2, 4);
    head.writeUInt32LE(how === 'length' ? n : 20 + json.length + tail.length, 8);
    head.writeUInt32LE(how === 'chunk-length' ? n : json.length, 12);
    head.writeUInt32LE(how === 'chunk-type' ? 0x004e4942 /* BIN first */ : 0x4e4f534a, 16);
    const body = how === 'json' ? Buffer.from(`{"asset":${'['.repeat(8)}}`.padEnd(json.length, ' ')) : json;
    let bytes = Buffer.concat([head, body, Buffer.from(tail)]);
    if (how === 'truncated') bytes = bytes.subarray(0, n % 20);
    return { kind: `glb, broken ${how}`, name: `${s}.glb`, bytes };
  });

/** Tolerance form values that are not positive numbers (Number() of them is not finite and > 0). */
export const badTolerance = fc
  .oneof(
    fc.constantFrom('0', '-1', '-0', 'NaN', 'Infinity', '-1e-9', 'abc', '1e999', '0x', '1,5', 'null', 'true', '--1', '1e-400'),
    fc.string({ minLength: 1, maxLength: 12 }),
    fc.double({ max: 0, noNaN: true }).map(String),
  )
  .filter((s) => {
    const v = Number(s.trim());
    return s.trim() !== '' && !(Number.isFinite(v) && v > 0);
  });
