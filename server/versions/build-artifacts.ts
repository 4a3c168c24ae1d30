/**
 * Everything a pack version stores, as bytes, computed from the pack's curves and the team's target
 * profiles with the shared baker (shared/bake) — pure, no I/O:
 *   source   canonical JSON { format: "tangentry.pack-source", version: 1, pack, curves: [documents in order] }
 *   per target profile: the JSON tables (writeJson), the binary pack (writePack, docs/runtime-format.md),
 *   and for a CSS target its linear() easings (writeCss).
 * A curve that fails to bake for a target is left out of that target's binary and CSS, appears in its
 * JSON as { name, error }, and is named with the reason in the bake summary.
 */
import { bakeCurve, sourceFromDocument, writeCss, writeJson, writePack, type CurveBake, type Profile } from '../../shared/bake';
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

const utf8 = (s: string) => new TextEncoder().encode(s);

/** "Handheld (tight)" → "handheld-tight", for file names. */
export function fileStem(name: string): string {
  return name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '') || 'target';
}

export function buildVersion(pack: { slug: string; name: string; frameRate: number; tags: string[] }, docs: readonly CurveDocument[], profiles: readonly Profile[]): BuiltVersion {
  const source = canonicalJson({ format: 'tangentry.pack-source', version: 1, pack: { slug: pack.slug, name: pack.name, frameRate: pack.frameRate, tags: pack.tags }, curves: docs });
  const objects: BuiltObject[] = [{ profileName: null, format: 'source', fileName: 'source.json', mediaType: 'application/json', bytes: utf8(source) }];
  const summary: BakeSummary[] = [];
  const sources = docs.map((d) => sourceFromDocument(d));
  for (const profile of profiles) {
    const bakes: CurveBake[] = sources.map((s, i) => bakeCurve(s, profile, { frameRate: docs[i]!.frameRate }));
    const ok = bakes.filter((b): b is Extract<CurveBake, { ok: true }> => b.ok);
    const s: BakeSummary = { profile: profile.name, curves: bakes.length, failed: bakes.length - ok.length, entries: 0, bytes: 0, overCap: 0, worstRatio: 0, failures: [] };
    for (const b of bakes) {
      if (!b.ok) { s.failures.push({ curve: b.name, error: b.error }); continue; }
      s.entries += b.report.entries;
      s.bytes += b.report.bytes;
      if (b.report.withinCap === false) s.overCap++;
      s.worstRatio = Math.max(s.worstRatio, b.report.certified / b.report.tolerance);
    }
    summary.push(s);
    const stem = fileStem(profile.name);
    const tables = ok.map((b) => ({ name: b.name, table: b.table }));
    objects.push({ profileName: profile.name, format: 'json', fileName: `${stem}.json`, mediaType: 'application/json', bytes: utf8(writeJson(bakes)) });
    objects.push({ profileName: profile.name, format: 'binary', fileName: `${stem}.tgpk`, mediaType: 'application/octet-stream', bytes: writePack(tables) });
    if (profile.output === 'css') objects.push({ profileName: profile.name, format: 'css', fileName: `${stem}.css`, mediaType: 'text/css', bytes: utf8(writeCss(tables)) });
  }
  return { objects, summary };
}
