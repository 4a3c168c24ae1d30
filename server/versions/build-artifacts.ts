/**
 * Everything a pack version stores, as bytes, computed from the pack's curves and the team's target
 * profiles with the shared baker (shared/bake) — pure, no I/O, deterministic (same input, same bytes):
 *   source   canonical JSON { format: "tangentry.pack-source", version: 1, pack, curves: [documents in order] }
 *   per target profile, in this order:
 *     json    the tables and bake reports (writeJson)
 *     binary  the binary pack (writePack, docs/runtime-format.md)
 *     c       a C99 header: reference evaluator + the pack as a byte array + one index macro per curve (writeCHeader)
 *     ts      a TypeScript module: reference evaluator + the pack (writeTsModule)
 *     gltf    glTF 2.0 JSON, one animation channel per curve, buffer inline (writeGltfPack's tracks; Khronos glTF 2.0 §3.11)
 *     css     for a CSS target, its linear() easings (writeCss)
 * These are the same writers `cli bake --format json|bin|c|ts|gltf|css` uses.
 * A curve that fails to bake for a target is left out of that target's outputs except JSON, which holds
 * { name, error }, and is named with the reason in the bake summary. A baked curve that glTF cannot hold
 * (a table starting before t = 0) is left out of the glTF only and listed in the summary's `omitted`.
 */
import { bakeCurve, gltfTrack, sourceFromDocument, writeCHeader, writeCss, writeJson, writePack, writeTsModule, type CurveBake, type PackCurve, type Profile } from '../../shared/bake';
import { writeGltf, type GltfTrack } from '../../shared/convert';
import type { CurveDocument } from '../../shared/curve';
import type { ArtifactFormat, BakeSummary } from '../../shared/schemas/versions';
import { canonicalJson } from './canonical-json';

export interface BuiltObject {
  profileName: string | null;
  format: ArtifactFormat;
  fileName: string;
  mediaType: string;
  bytes: Uint8Array;
}

export interface BuiltVersion {
  objects: BuiltObject[];
  summary: BakeSummary[];
}

export interface BuiltTarget {
  objects: BuiltObject[];
  summary: BakeSummary;
}

export interface PackMeta { slug: string; name: string; frameRate: number; tags: string[] }

/** An exception (not a curve that does not fit: that is a normal result) while baking one curve for one target. */
export class CurveBakeError extends Error {
  constructor(public readonly target: string, public readonly curve: string, cause: unknown) {
    super(`baking "${curve}" for ${target} failed: ${cause instanceof Error ? cause.message : String(cause)}`);
    this.name = 'CurveBakeError';
  }
}

const utf8 = (s: string) => new TextEncoder().encode(s);

/** "Handheld (tight)" → "handheld-tight", for file names. */
export function fileStem(name: string): string {
  return name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '') || 'target';
}

/** The version's source object: every curve document of the pack, in order, as canonical JSON. */
export function buildSource(pack: PackMeta, docs: readonly CurveDocument[]): BuiltObject {
  const source = canonicalJson({ format: 'tangentry.pack-source', version: 1, pack: { slug: pack.slug, name: pack.name, frameRate: pack.frameRate, tags: pack.tags }, curves: docs });
  return { profileName: null, format: 'source', fileName: 'source.json', mediaType: 'application/json', bytes: utf8(source) };
}

/** The curves of a stored source object (the inverse of buildSource). */
export function readSource(bytes: Uint8Array): { pack: PackMeta; curves: CurveDocument[] } {
  const parsed = JSON.parse(new TextDecoder().decode(bytes)) as { format?: string; pack: PackMeta; curves: CurveDocument[] };
  if (parsed.format !== 'tangentry.pack-source' || !Array.isArray(parsed.curves)) throw new Error('stored source: not a tangentry.pack-source');
  return { pack: parsed.pack, curves: parsed.curves };
}

/** Every output of one target profile. Throws CurveBakeError when the baker throws on a curve. */
export function buildTarget(docs: readonly CurveDocument[], profile: Profile, packSlug = 'tangentry'): BuiltTarget {
  const bakes: CurveBake[] = docs.map((d) => {
    try {
      return bakeCurve(sourceFromDocument(d), profile, { frameRate: d.frameRate });
    } catch (err) {
      throw new CurveBakeError(profile.name, d.name, err);
    }
  });
  const ok = bakes.filter((b): b is Extract<CurveBake, { ok: true }> => b.ok);
  const s: BakeSummary = { profile: profile.name, curves: bakes.length, failed: bakes.length - ok.length, entries: 0, bytes: 0, overCap: 0, worstRatio: 0, failures: [] };
  for (const b of bakes) {
    if (!b.ok) { s.failures.push({ curve: b.name, error: b.error }); continue; }
    s.entries += b.report.entries;
    s.bytes += b.report.bytes;
    if (b.report.withinCap === false) s.overCap++;
    s.worstRatio = Math.max(s.worstRatio, b.report.certified / b.report.tolerance);
  }
  const stem = fileStem(profile.name);
  const tables: PackCurve[] = ok.map((b) => ({ name: b.name, table: b.table }));
  const objects: BuiltObject[] = [
    { profileName: profile.name, format: 'json', fileName: `${stem}.json`, mediaType: 'application/json', bytes: utf8(writeJson(bakes)) },
    { profileName: profile.name, format: 'binary', fileName: `${stem}.tgpk`, mediaType: 'application/octet-stream', bytes: writePack(tables) },
    { profileName: profile.name, format: 'c', fileName: `${stem}.h`, mediaType: 'text/x-c', bytes: utf8(writeCHeader(tables, `${packSlug}_${stem}`)) },
    { profileName: profile.name, format: 'ts', fileName: `${stem}.ts`, mediaType: 'text/plain', bytes: utf8(writeTsModule(tables)) },
  ];
  const tracks: GltfTrack[] = [];
  const omitted: NonNullable<BakeSummary['omitted']> = [];
  for (const c of tables) {
    try {
      const track = gltfTrack(c);
      writeGltf([track]); // the writer's own checks (glTF 2.0 §3.11: times ≥ 0, strictly increasing, finite)
      tracks.push(track);
    } catch (err) {
      omitted.push({ curve: c.name, format: 'gltf', error: (err as Error).message });
    }
  }
  if (tracks.length) {
    const gltf = writeGltf(tracks, { generator: 'Tangentry baker' });
    objects.push({ profileName: profile.name, format: 'gltf', fileName: `${stem}.gltf`, mediaType: 'model/gltf+json', bytes: utf8(JSON.stringify(gltf.json) + '\n') });
  }
  if (omitted.length) s.omitted = omitted;
  if (profile.output === 'css') objects.push({ profileName: profile.name, format: 'css', fileName: `${stem}.css`, mediaType: 'text/css', bytes: utf8(writeCss(tables)) });
  return { objects, summary: s };
}

/** The whole version at once: the source, then every target's outputs (profiles in order). */
export function buildVersion(pack: PackMeta, docs: readonly CurveDocument[], profiles: readonly Profile[]): BuiltVersion {
  const objects: BuiltObject[] = [buildSource(pack, docs)];
  const summary: BakeSummary[] = [];
  for (const profile of profiles) {
    const t = buildTarget(docs, profile, pack.slug);
    objects.push(...t.objects);
    summary.push(t.summary);
  }
  return { objects, summary };
}
