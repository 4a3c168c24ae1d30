/**
 * Golden bake outputs: every demo curve (server/seed/demo-packs.ts) and a slice of the benchmark's
 * generated library (bench/library.ts, the same seeds as bench/bake.bench.ts) baked for every demo
 * profile (shared/bake/profile.ts DEMO_PROFILES) and a few extra uniform profiles (other encodings and
 * sample-count rules), then written in every output format. Each output is reduced to its SHA-256
 * (Node's crypto; FIPS 180-4). make-golden.ts stores the digests in golden-outputs.json; golden.test.ts
 * recomputes them, so a change to the baker that alters any byte of any output is seen at once.
 */
import { createHash } from 'node:crypto';
import {
  bakeCurve, DEMO_PROFILES, sourceFromDocument, writeJson, writePack, writeCHeader, writeTsModule, writeGltfPack, writeCss,
  type CurveBake, type PackCurve, type Profile,
} from '../../../shared/bake';
import { DEMO_PACKS } from '../../../server/seed/demo-packs';
import { randomCurve, rng } from '../../../bench/library';
import type { CurveDocument } from '../../../shared/curve';

const sha = (x: string | Uint8Array): string => createHash('sha256').update(x).digest('hex');

/** Extra uniform profiles: f32/f16 encodings, power-of-two and frame-aligned counts, a relative tolerance. */
const EXTRA: Profile[] = [
  { name: 'u-hermite-f32', tolerance: { mode: 'absolute', value: 1e-3 }, kernel: 'hermite', layout: 'uniform', encoding: 'f32', sampleCount: { rule: 'any' }, output: 'table' },
  { name: 'u-linear-f16-pow2', tolerance: { mode: 'absolute', value: 3e-3 }, kernel: 'linear', layout: 'uniform', encoding: 'f16', sampleCount: { rule: 'power-of-two' }, output: 'table' },
  { name: 'u-hermite-u8-frames', tolerance: { mode: 'relative', value: 1e-2 }, kernel: 'hermite', layout: 'uniform', encoding: 'unorm8', sampleCount: { rule: 'frame-aligned', frameRate: 64 }, output: 'table' },
  { name: 'u-linear-css', tolerance: { mode: 'absolute', value: 2e-3 }, kernel: 'linear', layout: 'uniform', encoding: 'f32', sampleCount: { rule: 'any' }, output: 'css' },
];
export const GOLDEN_PROFILES: readonly Profile[] = [...DEMO_PROFILES, ...EXTRA];

const KINDS = ['step', 'linear', 'hermite', 'bezier', 'shape', undefined] as const;
export const GOLDEN_SETS: Record<string, CurveDocument[]> = {
  demo: DEMO_PACKS.flatMap((p) => p.curves.map((c) => ({ ...c, name: `${p.slug}/${c.name}` }))),
  library: Array.from({ length: 90 }, (_, i) => randomCurve(rng(90_000 + i), `c-${i}`, KINDS[i % KINDS.length], 6)),
};

export interface GoldenEntry {
  /** SHA-256 of each output format over the curves that baked (css only for linear kernels). */
  outputs: Record<string, string>;
  /** SHA-256 of each curve's JSON entry (times, values, slopes, bytes, bound, maxError, or its error). */
  curves: Record<string, string>;
  /** SHA-256 of the full bake reports (entries, certified error, where, method, byte cap). */
  reports: string;
}

export function goldenEntry(docs: readonly CurveDocument[], profile: Profile): GoldenEntry {
  const bakes: CurveBake[] = docs.map((d) => bakeCurve(sourceFromDocument(d), profile, { frameRate: d.frameRate }));
  const good: PackCurve[] = bakes.flatMap((b) => (b.ok ? [{ name: b.name, table: b.table }] : []));
  // a format that refuses a curve (glTF: non-finite numbers, times too close) is written without it; the
  // refused names are part of the digest
  const accepted = (write: (c: readonly PackCurve[]) => unknown): { curves: PackCurve[]; refused: string } => {
    const ok: PackCurve[] = [], bad: string[] = [];
    for (const c of good) {
      try { write([c]); ok.push(c); } catch (e) { bad.push(`${c.name}: ${(e as Error).message}`); }
    }
    return { curves: ok, refused: bad.join('\n') };
  };
  const g = accepted((c) => writeGltfPack(c).glb());
  const gltf = writeGltfPack(g.curves);
  const outputs: Record<string, string> = {
    json: sha(writeJson(bakes)),
    bin: sha(writePack(good)),
    c: sha(writeCHeader(good)),
    ts: sha(writeTsModule(good)),
    gltf: sha(JSON.stringify(gltf.json) + g.refused),
    glb: sha(gltf.glb()),
  };
  if (profile.kernel === 'linear') {
    const c = accepted(writeCss);
    outputs.css = sha(writeCss(c.curves) + c.refused);
  }
  const curves: Record<string, string> = {};
  for (const b of bakes) curves[b.name] = sha(writeJson([b]));
  const reports = sha(JSON.stringify(bakes.map((b) => (b.ok ? b.report : { name: b.name, error: b.error }))));
  return { outputs, curves, reports };
}

/** set → profile → entry. */
export function goldenAll(): Record<string, Record<string, GoldenEntry>> {
  const out: Record<string, Record<string, GoldenEntry>> = {};
  for (const [set, docs] of Object.entries(GOLDEN_SETS)) {
    out[set] = {};
    for (const p of GOLDEN_PROFILES) out[set][p.name] = goldenEntry(docs, p);
  }
  return out;
}
