/**
 * One pg-boss per process, on the application's PostgreSQL (schema `pgboss`, created by migration 0009).
 * The API sends bake jobs through it; a process that works (the API with TANGENTRY_WORKER=inline, or
 * `npm run worker`) also runs the bake handlers (./bake-worker.ts). Started with startJobs(ctx) by
 * server/main.ts and scripts/worker.ts; jobsOf(ctx) starts it on first use (API tests build the app
 * without main.ts). stopJobs(ctx) stops it: graceful, waiting for a running bake up to 10 s, after which
 * pg-boss fails the job so it is retried.
 */
import PgBoss from 'pg-boss';
import type { AppContext } from '../context';
import { BAKE_DEAD_QUEUE, BAKE_QUEUE, BOSS_SCHEMA } from './names';
import { handleBakeJobs, handleDeadBakeJobs, type BakeJobData } from './bake-worker';

export interface Jobs {
  boss: PgBoss;
  /** true when this process runs the bake handlers. */
  working: boolean;
  /** Queues a bake under the given job id (a UUID the caller recorded in the bake row). */
  enqueueBake(bakeId: string, jobId: string): Promise<void>;
  stop(): Promise<void>;
}

const byContext = new WeakMap<AppContext, Promise<Jobs>>();
const running = new Set<Promise<Jobs>>();

async function open(ctx: AppContext, work: boolean): Promise<Jobs> {
  const c = ctx.config.jobs;
  const boss = new PgBoss({
    connectionString: ctx.config.databaseUrl,
    schema: BOSS_SCHEMA,
    max: 3,
    application_name: 'tangentry-jobs',
    schedule: false, // no cron jobs: no clock monitor
    maintenanceIntervalSeconds: c.maintenanceSeconds, // expires the jobs of a killed worker (then they are retried)
  });
  boss.on('error', (err: Error) => ctx.logger.warn({ err: err.message }, 'pg-boss error'));
  await boss.start();
  await boss.createQueue(BAKE_DEAD_QUEUE, { name: BAKE_DEAD_QUEUE });
  await boss.createQueue(BAKE_QUEUE, { name: BAKE_QUEUE, deadLetter: BAKE_DEAD_QUEUE });
  const workers: string[] = [];
  if (work) {
    const opts = { batchSize: 1, includeMetadata: true as const, pollingIntervalSeconds: c.pollSeconds };
    workers.push(await boss.work<BakeJobData>(BAKE_QUEUE, opts, (jobs) => handleBakeJobs(ctx, jobs)));
    workers.push(await boss.work<BakeJobData>(BAKE_DEAD_QUEUE, opts, (jobs) => handleDeadBakeJobs(ctx, jobs)));
  }
  let stopped: Promise<void> | null = null;
  return {
    boss,
    working: work,
    async enqueueBake(bakeId, jobId) {
      const id = await boss.send(BAKE_QUEUE, { bakeId, jobId } satisfies BakeJobData, {
        id: jobId, retryLimit: c.retryLimit, retryDelay: c.retryDelaySeconds, retryBackoff: true, expireInSeconds: c.expireSeconds, deadLetter: BAKE_DEAD_QUEUE,
      });
      if (!id) throw new Error('pg-boss did not create the bake job');
      if (workers[0]) boss.notifyWorker(workers[0]); // start now rather than at the next poll
    },
    stop() {
      stopped ??= boss.stop({ graceful: true, wait: true, timeout: 10_000 });
      return stopped;
    },
  };
}

/** Starts this context's pg-boss (once); `work` defaults to TANGENTRY_WORKER=inline. */
export function startJobs(ctx: AppContext, opts: { work?: boolean } = {}): Promise<Jobs> {
  const existing = byContext.get(ctx);
  if (existing) return existing;
  const p = open(ctx, opts.work ?? ctx.config.jobs.worker === 'inline');
  byContext.set(ctx, p);
  running.add(p);
  p.catch(() => {
    byContext.delete(ctx);
    running.delete(p);
  });
  return p;
}

export const jobsOf = (ctx: AppContext): Promise<Jobs> => startJobs(ctx);

export async function stopJobs(ctx: AppContext): Promise<void> {
  const p = byContext.get(ctx);
  if (!p) return;
  byContext.delete(ctx);
  running.delete(p);
  await (await p).stop();
}

/** Every pg-boss this process started (for test teardown). */
export async function stopAllJobs(): Promise<void> {
  const all = [...running];
  running.clear();
  await Promise.all(all.map(async (p) => (await p.catch(() => null))?.stop()));
}
