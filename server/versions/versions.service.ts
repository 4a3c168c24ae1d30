/**
 * Pack versions. Proposing one, synchronously inside the request (no background queue yet):
 *   1. read the pack's curves and the team's target profiles;
 *   2. build every object with the shared baker (./build-artifacts.ts): the source and, per target,
 *      the JSON tables, the binary pack and (CSS targets) the linear() easings;
 *   3. store each object in the bucket under `sha256/<hex>` (HeadObject first: identical content is reused);
 *   4. only then insert the version and its artifact rows in one transaction.
 * A storage failure in step 3 leaves no version row (objects already stored are content-addressed, so a
 * retry reuses them and no row points at a missing object). A curve that cannot be baked for a target is
 * not a storage failure: the version records it per target with the curve's name and the reason.
 */
import type { S3Client } from '@aws-sdk/client-s3';
import type { Readable } from 'node:stream';
import type { Principal } from '../auth/principal';
import { HttpError, badRequest, conflict, notFound } from '../http/errors';
import { getPack } from '../packs/packs.service';
import { listCurves } from '../packs/packs.repository';
import { listProfiles } from '../profiles/profiles.repository';
import { openObject, putContentAddressed, readContentAddressed } from '../storage/content-store';
import type { ArtifactDto, ReviewDecision, VersionComparison, VersionDto } from '../../shared/schemas/versions';
import type { CurveDocument } from '../../shared/curve';
import { compareVersions } from './compare-versions';
import { buildVersion } from './build-artifacts';
import * as repo from './versions.repository';

export interface Storage {
  s3: S3Client;
  bucket: string;
}

export async function listVersions(p: Principal, teamId: string, slug: string): Promise<VersionDto[]> {
  const pack = await getPack(p, teamId, slug);
  return repo.listVersions(pack.id);
}

export async function getVersion(p: Principal, teamId: string, slug: string, number: number): Promise<VersionDto> {
  const pack = await getPack(p, teamId, slug);
  const v = Number.isSafeInteger(number) && number > 0 ? await repo.findVersion(pack.id, number) : null;
  if (!v) throw notFound(`Pack "${slug}" has no version v${number}.`);
  return v;
}

export async function proposeVersion(storage: Storage, p: Principal, teamId: string, slug: string, changelog: string, userId: string): Promise<VersionDto> {
  const pack = await getPack(p, teamId, slug);
  if (pack.archived) throw conflict(`Pack "${slug}" is archived; restore it before proposing a version.`, 'pack_archived');
  const curves = await listCurves(pack.id);
  if (curves.length === 0) throw badRequest(`Pack "${slug}" has no curves; add one before proposing a version.`, { pack: 'pack: has no curves' });
  const profiles = (await listProfiles(teamId)).map((s) => s.profile);
  const built = buildVersion(pack, curves.map((c) => c.document), profiles);
  const stored: Omit<ArtifactDto, 'id'>[] = [];
  for (const o of built.objects) {
    let s;
    try {
      s = await putContentAddressed(storage.s3, storage.bucket, o.bytes, o.mediaType);
    } catch (err) {
      throw new HttpError(503, 'storage_unavailable', `Could not store the ${o.profileName ? `${o.profileName} ${o.format}` : 'source'} of this version (${(err as Error).message}); no version was created. Try again.`);
    }
    stored.push({ profileName: o.profileName, format: o.format, fileName: o.fileName, mediaType: o.mediaType, key: s.key, sha256: s.sha256, size: s.size });
  }
  const source = stored[0]!;
  return repo.insertVersion({
    packId: pack.id, changelog, proposedBy: userId, curveCount: curves.length,
    source: { key: source.key, sha256: source.sha256, size: source.size }, bakeSummary: built.summary, artifacts: stored,
  });
}

/** The artifact's manifest entry and download name; `open()` streams its bytes from the bucket. */
export async function findArtifact(storage: Storage, p: Principal, teamId: string, slug: string, number: number, artifactId: string): Promise<{ artifact: ArtifactDto; downloadName: string; open: () => Promise<Readable> }> {
  const v = await getVersion(p, teamId, slug, number);
  const artifact = v.artifacts.find((a) => a.id === artifactId);
  if (!artifact) throw notFound(`Version v${number} of "${slug}" has no such artifact.`);
  return { artifact, downloadName: `${slug}-v${number}-${artifact.fileName}`, open: async () => (await openObject(storage.s3, storage.bucket, artifact.key)).body };
}

async function sourceCurves(storage: Storage, v: VersionDto): Promise<CurveDocument[]> {
  const bytes = await readContentAddressed(storage.s3, storage.bucket, v.source.key);
  return (JSON.parse(new TextDecoder().decode(bytes)) as { curves: CurveDocument[] }).curves;
}

/** Compares version `number` with `against` (default: the one before it), from their stored sources. */
export async function compare(storage: Storage, p: Principal, teamId: string, slug: string, number: number, against?: number): Promise<VersionComparison> {
  const to = await getVersion(p, teamId, slug, number);
  const base = against ?? number - 1;
  if (base < 1) throw badRequest(`against: v${number} has no earlier version; name one to compare with`, { against: `against: v${number} has no earlier version` });
  if (base === number) throw badRequest('against: choose a different version', { against: 'against: choose a different version' });
  const from = await getVersion(p, teamId, slug, base);
  const [a, b] = await Promise.all([sourceCurves(storage, from), sourceCurves(storage, to)]);
  return compareVersions({ number: from.number, curves: a, bakeSummary: from.bakeSummary }, { number: to.number, curves: b, bakeSummary: to.bakeSummary });
}

/** A lead's review: approve, or request changes with a comment. Every review is kept. */
export async function review(p: Principal, teamId: string, slug: string, number: number, reviewerId: string, input: { decision: ReviewDecision; comment: string }): Promise<VersionDto> {
  const pack = await getPack(p, teamId, slug);
  await getVersion(p, teamId, slug, number);
  const v = await repo.insertReview(pack.id, number, { reviewerId, ...input });
  if (!v) throw notFound(`Pack "${slug}" has no version v${number}.`);
  return v;
}
