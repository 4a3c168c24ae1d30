/**
 * "The background bake survives a worker restart" (issue 7) and "the worker killed with SIGKILL in the
 * middle of a bake → the job is retried and no half version appears" (issue 9): the API side here queues
 * only (TANGENTRY_WORKER=off); the bakes run in a separate `tsx scripts/worker.ts` process on the same
 * PostgreSQL and S3 fake. The first worker is killed with SIGKILL between targets (a 400 ms pause per
 * target, TANGENTRY_BAKE_DELAY_MS); pg-boss expires its job (expireInSeconds 5, maintenance every second)
 * and retries it; a second worker finishes it. Exactly one version appears, with every object stored.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { spawn, type ChildProcess } from 'node:child_process';
import { join } from 'node:path';
import { HeadObjectCommand } from '@aws-sdk/client-s3';
import { QueryTypes } from 'sequelize';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail } from '../support/accounts';
import { versionOfBake, waitForBake } from '../support/bakes';
import { PackVersion, VersionBake } from '../../server/models';

const PASSWORD = 'restart password 1';
const root = join(import.meta.dirname, '..', '..');
const JOB_ENV = { TANGENTRY_BAKE_EXPIRE_SECONDS: '5', TANGENTRY_BAKE_RETRY_DELAY_SECONDS: '1', TANGENTRY_BAKE_RETRY_LIMIT: '3', TANGENTRY_JOBS_MAINTENANCE_SECONDS: '1', TANGENTRY_JOBS_POLL_SECONDS: '0.5' };

/**
 * `scripts/worker.ts` under tsx against the test's database and bucket; resolves once it says it is running.
 * Node itself with tsx's loader (`node --import tsx`), not the tsx CLI: the CLI runs the script in a child
 * process, so a SIGKILL to it would orphan the real worker instead of killing it.
 */
function startWorker(databaseUrl: string): Promise<ChildProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/worker.ts'], {
    cwd: root,
    env: { ...process.env, ...JOB_ENV, DATABASE_URL: databaseUrl, NODE_ENV: 'test', LOG_LEVEL: 'warn', TANGENTRY_BAKE_DELAY_MS: '400' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  return new Promise((resolve, reject) => {
    let out = '';
    const timer = setTimeout(() => reject(new Error(`worker did not start within 30 s: ${out}`)), 30_000);
    const onData = (b: Buffer) => {
      out += b.toString();
      if (out.includes('bake worker is running')) {
        clearTimeout(timer);
        resolve(child);
      }
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', (b: Buffer) => (out += b.toString()));
    child.once('exit', (code) => reject(new Error(`worker exited with ${code}: ${out}`)));
  });
}

const exited = (c: ChildProcess) => new Promise<void>((r) => (c.exitCode !== null || c.signalCode !== null ? r() : c.once('exit', () => r())));

describe('a bake survives a worker killed in the middle', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let team = '';
  let animator = '';
  const workers: ChildProcess[] = [];

  beforeAll(async () => {
    t = await testApp({ label: 'restart', seed: true, env: { ...JOB_ENV, TANGENTRY_WORKER: 'off' } });
    team = await teamId('ui-motion');
    const email = uniqueEmail('restart-animator');
    await createPerson({ email, password: PASSWORD, teams: { 'ui-motion': 'animator' } });
    animator = await signIn(t.app, email, PASSWORD);
  });
  afterAll(async () => {
    for (const w of workers) if (w.exitCode === null && w.signalCode === null) { w.kill('SIGTERM'); await exited(w); }
    await t?.close();
  });

  it('SIGKILL mid-bake: no version while it is down, a new worker completes the bake exactly once', async () => {
    const pack = `/api/teams/${team}/packs/menu-transitions`;
    const packId = (await request(t.app).get(pack).set('Cookie', animator)).body.pack.id as string;
    const res = await request(t.app).post(`${pack}/versions`).set('Cookie', animator).set('Origin', ORIGIN).send({ changelog: 'Survives a restart.' });
    expect(res.status).toBe(202);
    const id = res.body.bake.id as string;
    // nobody works the queue yet (the API runs no worker): it stays queued
    await new Promise((r) => setTimeout(r, 1_000));
    expect((await waitForBake(t.app, animator, team, 'menu-transitions', id, { until: () => true })).state).toBe('queued');

    const first = await startWorker(t.databaseUrl);
    workers.push(first);
    const mid = await waitForBake(t.app, animator, team, 'menu-transitions', id, { until: (b) => b.state === 'baking' && b.progress.done >= 1 });
    expect(mid.progress.done).toBeLessThan(mid.progress.total);
    first.kill('SIGKILL');
    await exited(first);
    expect(first.signalCode).toBe('SIGKILL');
    // killed: still baking (its job is active until pg-boss expires it), and no version, not even half of one
    const after = await waitForBake(t.app, animator, team, 'menu-transitions', id, { until: () => true });
    expect(after.state).toBe('baking');
    expect(after.attempts).toBe(1);
    expect(await PackVersion.count({ where: { packId } })).toBe(0);

    const second = await startWorker(t.databaseUrl);
    workers.push(second);
    const done = await waitForBake(t.app, animator, team, 'menu-transitions', id, { ms: 45_000 });
    expect(done.state, JSON.stringify(done.failure)).toBe('done');
    expect(done.attempts).toBeGreaterThanOrEqual(2);
    const v = await versionOfBake(t.app, animator, team, 'menu-transitions', done);
    expect(v.number).toBe(1);
    for (const a of v.artifacts) {
      const head = await t.ctx.s3.send(new HeadObjectCommand({ Bucket: t.config.s3.bucket, Key: a.key }));
      expect(head.ContentLength).toBe(a.size);
    }
    // exactly once: one version, one bake pointing at it, and pg-boss holds no job of this bake still to run
    await new Promise((r) => setTimeout(r, 2_000));
    expect(await PackVersion.count({ where: { packId } })).toBe(1);
    expect((await VersionBake.findAll({ where: { packId } })).map((b) => [b.state, b.versionId])).toEqual([['done', v.id]]);
    const open = await t.ctx.sequelize.query<{ n: string }>(
      `SELECT count(*) AS n FROM pgboss.job WHERE data->>'bakeId' = :id AND state IN ('created', 'retry', 'active')`,
      { replacements: { id }, type: QueryTypes.SELECT },
    );
    expect(Number(open[0]!.n)).toBe(0);
  }, 90_000);
});
