/**
 * The pg-boss handlers of background bakes. A job carries only the bake's id; everything else is in the
 * `version_bakes` row (server/versions/bakes.repository.ts), so a retried job — after an exception, a
 * storage outage, or a worker killed mid-bake whose job pg-boss expired — simply runs the bake again:
 * stored objects are content-addressed and reused, and the version is inserted under the bake row's lock
 * only if the bake has none yet, so the same bake never makes two versions.
 *
 * When a version appears the team hears `version.proposed`; when the last attempt fails, `version.bake-failed`.
 */
import type { Job, JobWithMetadata } from 'pg-boss';
import type { AppContext } from '../context';
import { runBake } from '../versions/bake-runner';
import * as bakes from '../versions/bakes.repository';

export interface BakeJobData {
  bakeId: string;
  /** The pg-boss job id, also kept in the bake row: a dead-lettered copy of an older job is recognised as stale. */
  jobId: string;
}

async function publishFailure(ctx: AppContext, bakeId: string, failure: { target: string | null; curve: string | null; reason: string }): Promise<void> {
  const row = await bakes.bakeRow(bakeId);
  const pack = row ? await bakes.packOfBake(row.packId as string) : null;
  if (!row || !pack) return;
  await ctx.events.publish({
    type: 'version.bake-failed', teamId: pack.teamId, actorId: null, pack: { id: pack.id, slug: pack.slug, name: pack.name },
    subject: { kind: 'version', id: row.id, label: 'proposal' },
    data: { bakeId: row.id, changelog: row.changelog, proposedBy: row.proposedBy, target: failure.target, curve: failure.curve, reason: failure.reason, attempts: row.attempts },
  });
}

export async function handleBakeJobs(ctx: AppContext, jobs: JobWithMetadata<BakeJobData>[]): Promise<void> {
  for (const job of jobs) {
    const final = job.retryCount >= job.retryLimit;
    const outcome = await runBake({ storage: { s3: ctx.s3, bucket: ctx.config.s3.bucket }, delayMs: ctx.config.jobs.bakeDelayMs }, job.data.bakeId, { final });
    if (outcome.kind === 'failed') {
      ctx.logger.warn({ bakeId: job.data.bakeId, ...outcome.failure, final }, 'bake attempt failed');
      if (final) await publishFailure(ctx, job.data.bakeId, outcome.failure);
      throw new Error(outcome.failure.reason); // pg-boss retries (with backoff) or, after the last, dead-letters the job
    }
    if (outcome.kind === 'done' && outcome.created) {
      const v = outcome.version;
      const pack = await bakes.packOfBake(v.packId);
      ctx.logger.info({ bakeId: outcome.bakeId, version: v.number }, 'bake done');
      if (pack) {
        await ctx.events.publish({
          type: 'version.proposed', teamId: pack.teamId, actorId: outcome.proposedBy, pack: { id: pack.id, slug: pack.slug, name: pack.name },
          subject: { kind: 'version', id: v.id, label: `v${v.number}` }, data: { version: v.number, changelog: v.changelog, bakeId: outcome.bakeId },
        });
      }
    }
  }
}

/**
 * A bake job that used its last retry without the handler recording it (the worker was killed, or the
 * attempt outlived expireInSeconds): the bake is marked failed so it can be retried by hand.
 */
export async function handleDeadBakeJobs(ctx: AppContext, jobs: Job<BakeJobData>[]): Promise<void> {
  for (const job of jobs) {
    const row = await bakes.bakeRow(job.data.bakeId);
    if (!row || row.state === 'done' || row.state === 'failed' || row.jobId !== job.data.jobId) continue;
    const failure = { target: null, curve: null, reason: 'the bake stopped before it finished (the worker ended or the attempt timed out) and no retry is left' };
    await bakes.recordFailure(row.id, row.failure ? { ...row.failure, reason: `${row.failure.reason}; ${failure.reason}` } : failure, true);
    await publishFailure(ctx, row.id, failure);
  }
}
