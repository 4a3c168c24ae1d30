/**
 * Proposing a version, in the background (issue 7 part 2):
 *   1. in the request: read the pack's curves and the team's target profiles, store the source object
 *      (canonical JSON, content-addressed), and record a `version_bakes` row (queued) that names it and
 *      snapshots the profiles — later curve or profile edits do not change the proposal;
 *   2. the route queues a pg-boss job (server/jobs); a worker bakes every target (./bake-runner.ts) and
 *      only when every object is stored inserts the version and its artifacts in one transaction.
 * GET …/bakes follows progress; a failed bake can be retried (same snapshot, objects already stored reused).
 */
import { randomUUID } from 'node:crypto';
import type { Principal } from '../auth/principal';
import { HttpError, badRequest, conflict, notFound } from '../http/errors';
import { getPack } from '../packs/packs.service';
import { listCurves } from '../packs/packs.repository';
import { listProfiles } from '../profiles/profiles.repository';
import { putContentAddressed } from '../storage/content-store';
import type { BakeDto } from '../../shared/schemas/versions';
import { buildSource } from './build-artifacts';
import type { Storage } from './versions.service';
import * as bakes from './bakes.repository';

/** Anything that can queue a bake job (server/jobs/boss.ts Jobs). */
export interface BakeQueue {
  enqueueBake(bakeId: string, jobId: string): Promise<void>;
}

/** Steps 1: snapshot the pack and record the proposal. 503 storage_unavailable (nothing recorded) when the bucket is down. */
export async function snapshotProposal(storage: Storage, p: Principal, teamId: string, slug: string, changelog: string, userId: string): Promise<BakeDto> {
  const pack = await getPack(p, teamId, slug);
  if (pack.archived) throw conflict(`Pack "${slug}" is archived; restore it before proposing a version.`, 'pack_archived');
  const curves = await listCurves(pack.id);
  if (curves.length === 0) throw badRequest(`Pack "${slug}" has no curves; add one before proposing a version.`, { pack: 'pack: has no curves' });
  const profiles = (await listProfiles(teamId)).map((s) => s.profile);
  const source = buildSource(pack, curves.map((c) => c.document));
  let s;
  try {
    s = await putContentAddressed(storage.s3, storage.bucket, source.bytes, source.mediaType);
  } catch (err) {
    throw new HttpError(503, 'storage_unavailable', `Could not store the source of this version (${(err as Error).message}); nothing was proposed. Try again.`);
  }
  return bakes.insertBake({ packId: pack.id, proposedBy: userId, changelog, curveCount: curves.length, source: { key: s.key, sha256: s.sha256, size: s.size }, profiles });
}

/** Step 2: queue the bake. If the queue cannot take it, the bake is marked failed (retryable) and 503 answers. */
export async function enqueue(queue: BakeQueue, bake: BakeDto): Promise<BakeDto> {
  const jobId = randomUUID();
  await bakes.setJobId(bake.id, jobId);
  try {
    await queue.enqueueBake(bake.id, jobId);
  } catch (err) {
    await bakes.recordFailure(bake.id, { target: null, curve: null, reason: `could not queue the bake: ${(err as Error).message}` }, true);
    throw new HttpError(503, 'queue_unavailable', `The proposal was recorded but its bake could not be queued (${(err as Error).message}); retry it from the pack page.`);
  }
  return bake;
}

export async function proposeBake(storage: Storage, queue: BakeQueue, p: Principal, teamId: string, slug: string, changelog: string, userId: string): Promise<BakeDto> {
  return enqueue(queue, await snapshotProposal(storage, p, teamId, slug, changelog, userId));
}

export async function listBakes(p: Principal, teamId: string, slug: string): Promise<BakeDto[]> {
  const pack = await getPack(p, teamId, slug);
  return bakes.listOpenBakes(pack.id);
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export async function getBake(p: Principal, teamId: string, slug: string, id: string): Promise<BakeDto> {
  const pack = await getPack(p, teamId, slug);
  const b = UUID.test(id) ? await bakes.findBake(pack.id, id) : null;
  if (!b) throw notFound(`Pack "${slug}" has no such bake.`);
  return b;
}

/** A failed bake back to the queue (same snapshot); 409 not_failed for any other state. */
export async function retryBake(queue: BakeQueue, p: Principal, teamId: string, slug: string, id: string): Promise<BakeDto> {
  const current = await getBake(p, teamId, slug, id);
  const pack = await getPack(p, teamId, slug);
  const b = await bakes.requeue(pack.id, current.id);
  if (!b) throw conflict(`This bake is ${current.state}; only a failed bake can be retried.`, 'not_failed');
  return enqueue(queue, b);
}
