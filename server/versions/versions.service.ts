/**
 * Pack versions: reading manifests, downloads, comparisons and reviews. Proposing one is a background
 * bake (./bakes.service.ts → server/jobs → ./bake-runner.ts): the version row and its artifact rows are
 * inserted in one transaction only when the source and every artifact are stored. proposeVersion below runs
 * the same steps in the caller, for tools and tests that need a version at once.
 */
import type { S3Client } from '@aws-sdk/client-s3';
import type { Readable } from 'node:stream';
import type { Principal } from '../auth/principal';
import { HttpError, badRequest, notFound } from '../http/errors';
import { getPack } from '../packs/packs.service';
import { openObject, readContentAddressed } from '../storage/content-store';
import type { ArtifactDto, ReviewDecision, VersionComparison, VersionDto } from '../../shared/schemas/versions';
import type { CurveDocument } from '../../shared/curve';
import { compareVersions } from './compare-versions';
import { runBake } from './bake-runner';
import { snapshotProposal } from './bakes.service';
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

/**
 * Proposes and bakes a version in this call (no queue): the same snapshot and bake as the background path.
 * A failure answers 503 storage_unavailable naming the target and reason; the bake row stays failed.
 */
export async function proposeVersion(storage: Storage, p: Principal, teamId: string, slug: string, changelog: string, userId: string): Promise<VersionDto> {
  const bake = await snapshotProposal(storage, p, teamId, slug, changelog, userId);
  const outcome = await runBake({ storage }, bake.id, { final: true });
  if (outcome.kind === 'done') return outcome.version;
  if (outcome.kind === 'gone') throw notFound(`Pack "${slug}" is gone.`);
  throw new HttpError(503, 'storage_unavailable', `The bake failed${outcome.failure.target ? ` at ${outcome.failure.target}` : ''} (${outcome.failure.reason}); no version was created.`);
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
