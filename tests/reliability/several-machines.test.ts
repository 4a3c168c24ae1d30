/**
 * Several machines: two API processes (`server/main.ts`, TANGENTRY_WORKER=off) and one separate bake
 * worker (`scripts/worker.ts`) on one PostgreSQL database and the S3 fake, as child processes. The test
 * process only prepares the database (migrations come with the template, the demo studio is seeded
 * here so the children start with TANGENTRY_SEED=false) and talks HTTP to the children.
 * Both API processes share one PUBLIC_URL, as behind a load balancer (one public name, so one Origin).
 * Children run as `node --import tsx …` rather than the tsx CLI, so a kill reaches the real process
 * (the CLI would run the script in a grandchild). Everything is killed in afterAll, SIGKILL after 5 s.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type { Express } from 'express';
import { spawn, type ChildProcess } from 'node:child_process';
import { createServer, type Server } from 'node:http';
import { join } from 'node:path';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, teamId, uniqueEmail } from '../support/accounts';
import { freePort } from '../../scripts/services/free-port';
import { proposeAndWait } from './support/proposals';
import { VersionBake } from '../../server/models';

const PASSWORD = 'several machines password 1';
const root = join(import.meta.dirname, '..', '..');
const SHARED_ENV = {
  NODE_ENV: 'test',
  TANGENTRY_SEED: 'false',
  TANGENTRY_WORKER: 'off',
  TANGENTRY_JOBS_POLL_SECONDS: '0.5',
  TANGENTRY_JOBS_MAINTENANCE_SECONDS: '5',
  WEBHOOK_ALLOW_PRIVATE_TARGETS: 'true',
  WEBHOOK_POLL_MS: '100',
  WEBHOOK_RETRY_SCHEDULE: '0.5,0.5',
  AUTH_RATE_LIMIT: '100000',
};

const children: ChildProcess[] = [];

/** Start a child; resolves once a line of its output matches `ready` (returns that match). */
function start(script: string, env: NodeJS.ProcessEnv, ready: RegExp): Promise<{ child: ChildProcess; match: RegExpMatchArray }> {
  const child = spawn(process.execPath, ['--import', 'tsx', script], { cwd: root, env: { ...process.env, ...SHARED_ENV, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  children.push(child);
  return new Promise((resolve, reject) => {
    let out = '';
    const timer = setTimeout(() => reject(new Error(`${script} did not start within 30 s: ${out.slice(-2000)}`)), 30_000);
    const onData = (b: Buffer) => {
      out += b.toString();
      const m = out.match(ready);
      if (m) {
        clearTimeout(timer);
        resolve({ child, match: m });
      }
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', onData);
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`${script} exited with ${code}: ${out.slice(-2000)}`));
    });
  });
}

async function stopAll(): Promise<void> {
  await Promise.all(
    children.map(
      (c) =>
        new Promise<void>((resolve) => {
          if (c.exitCode !== null || c.signalCode !== null) return resolve();
          const hard = setTimeout(() => c.kill('SIGKILL'), 5_000);
          c.once('exit', () => {
            clearTimeout(hard);
            resolve();
          });
          c.kill('SIGTERM');
        }),
    ),
  );
}

/** A webhook receiver counting every request by its Tangentry-Delivery id. */
function startReceiver(): Promise<{ server: Server; url: string; got: { delivery: string; event: string }[] }> {
  const got: { delivery: string; event: string }[] = [];
  const server = createServer((req, res) => {
    req.resume();
    req.on('end', () => {
      got.push({ delivery: String(req.headers['tangentry-delivery']), event: String(req.headers['tangentry-event']) });
      res.writeHead(204).end();
    });
  });
  return new Promise((resolve) =>
    server.listen(0, '127.0.0.1', () => {
      const a = server.address();
      resolve({ server, url: `http://127.0.0.1:${typeof a === 'object' && a ? a.port : 0}`, got });
    }),
  );
}

describe('two API processes and a worker on one database', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let A = '';
  let B = '';
  let team = '';
  let lead = '';
  let admin = '';
  let receiver: Awaited<ReturnType<typeof startReceiver>>;
  /** The first pack's two new versions, released by the channel test. */
  let released: { url: string; numbers: number[] } | undefined;
  const as = (url: string) => url as unknown as Express; // supertest takes a base URL as well as an app
  const signInAt = async (base: string, email: string) => {
    const res = await request(base).post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email, password: PASSWORD });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const c = (res.headers['set-cookie'] as unknown as string[]).find((v) => v.startsWith('tangentry_session='))!;
    return c.split(';')[0]!;
  };

  beforeAll(async () => {
    t = await testApp({ label: 'several_machines', seed: true });
    team = await teamId('ui-motion');
    const leadEmail = uniqueEmail('machines-lead');
    const adminEmail = uniqueEmail('machines-admin');
    await createPerson({ email: leadEmail, password: PASSWORD, name: 'Machines Lead', teams: { 'ui-motion': 'lead' } });
    await createPerson({ email: adminEmail, password: PASSWORD, name: 'Machines Admin', teams: { 'ui-motion': 'admin' } });
    receiver = await startReceiver();
    const common = { DATABASE_URL: t.databaseUrl, S3_BUCKET: t.config.s3.bucket, LOG_LEVEL: 'info', HOST: '127.0.0.1' };
    const [portA, portB] = [await freePort(), await freePort()];
    const listening = /"url":"(http:\/\/127\.0\.0\.1:\d+)"[^\n]*Tangentry is listening|Tangentry is listening[^\n]*"url":"(http:\/\/127\.0\.0\.1:\d+)"/;
    const [a, b] = await Promise.all([
      start('server/main.ts', { ...common, PORT: String(portA), PUBLIC_URL: ORIGIN }, listening),
      start('server/main.ts', { ...common, PORT: String(portB), PUBLIC_URL: ORIGIN }, listening),
      start('scripts/worker.ts', { ...common, LOG_LEVEL: 'warn' }, /bake worker is running/),
    ]);
    A = a.match[1] ?? a.match[2]!;
    B = b.match[1] ?? b.match[2]!;
    lead = await signInAt(A, leadEmail);
    admin = await signInAt(B, adminEmail);
  }, 45_000);

  afterAll(async () => {
    await stopAll();
    await new Promise<void>((r) => (receiver ? receiver.server.close(() => r()) : r()));
    await t?.close();
  }, 20_000);

  it('a session made on A works on B, and signing out on B ends it on A', async () => {
    const email = uniqueEmail('machines-viewer');
    await createPerson({ email, password: PASSWORD, name: 'Machines Viewer', teams: { 'ui-motion': 'viewer' } });
    const cookie = await signInAt(A, email);
    const onA = await request(A).get('/api/auth/me').set('Cookie', cookie);
    const onB = await request(B).get('/api/auth/me').set('Cookie', cookie);
    expect(onB.status).toBe(200);
    expect(onB.body.user.email).toBe(email);
    expect(onB.body.user.id).toBe(onA.body.user.id);
    expect((await request(B).post('/api/auth/sign-out').set('Cookie', cookie).set('Origin', ORIGIN).send({})).status).toBeLessThan(300);
    expect((await request(A).get('/api/auth/me').set('Cookie', cookie)).status).toBe(401);
  });

  it('proposals of two packs through A and B at once: each bake runs once, distinct numbers, seen from both', async () => {
    const packs = ((await request(A).get(`/api/teams/${team}/packs`).set('Cookie', lead)).body.packs as { slug: string }[]).slice(0, 2);
    expect(packs).toHaveLength(2);
    const urls = packs.map((p) => `/api/teams/${team}/packs/${p.slug}`);
    const outcomes = await Promise.all(
      urls.flatMap((u) => [proposeAndWait(as(A), lead, u, 'machines from A', { ms: 40_000 }), proposeAndWait(as(B), lead, u, 'machines from B', { ms: 40_000 })]),
    );
    for (const o of outcomes) expect(o.number, JSON.stringify(o.failure ?? o.body)).not.toBeNull();
    for (let i = 0; i < 2; i++) {
      const [x, y] = [outcomes[2 * i]!.number!, outcomes[2 * i + 1]!.number!];
      expect(x).not.toBe(y);
      for (const base of [A, B]) {
        const list = await request(base).get(`${urls[i]}/versions`).set('Cookie', lead);
        const numbers = (list.body.versions as { number: number }[]).map((v) => v.number);
        expect(numbers).toEqual(expect.arrayContaining([x, y]));
        expect(new Set(numbers).size).toBe(numbers.length); // no number twice
      }
    }
    // one version per bake, one worker attempt per bake (nothing failed, so nothing was retried)
    const bakes = await VersionBake.findAll({ where: { id: outcomes.map((o) => o.bakeId!) } });
    expect(bakes).toHaveLength(4);
    for (const b of bakes) {
      expect(b.state).toBe('done');
      expect(b.attempts).toBe(1);
    }
    expect(new Set(bakes.map((b) => b.versionId)).size).toBe(4);
    released = { url: urls[0]!, numbers: [outcomes[0]!.number!, outcomes[1]!.number!] };
  }, 50_000);

  it('one channel moved from A and B at once: one history, identical on both; the webhook registered on A arrives once per move', async () => {
    expect(released, 'the proposal test made the versions to release').toBeDefined();
    const { url, numbers } = released!;
    const hook = await request(A).post(`/api/teams/${team}/webhooks`).set('Cookie', admin).set('Origin', ORIGIN).send({ url: `${receiver.url}/machines`, events: ['channel.moved'], description: 'several machines' });
    expect(hook.status, JSON.stringify(hook.body)).toBe(201);
    for (const n of numbers) {
      const r = await request(A).post(`${url}/versions/${n}/reviews`).set('Cookie', lead).set('Origin', ORIGIN).send({ decision: 'approve' });
      expect(r.status, JSON.stringify(r.body)).toBe(201);
    }
    const channel = `${url}/channels/machines`;
    const [ra, rb] = await Promise.all([
      request(A).put(channel).set('Cookie', lead).set('Origin', ORIGIN).send({ version: numbers[0] }),
      request(B).put(channel).set('Cookie', lead).set('Origin', ORIGIN).send({ version: numbers[1] }),
    ]);
    for (const r of [ra, rb]) expect([200, 409], JSON.stringify(r.body)).toContain(r.status);
    const fromA = (await request(A).get(`${url}/channels`).set('Cookie', lead)).body;
    const fromB = (await request(B).get(`${url}/channels`).set('Cookie', lead)).body;
    expect(fromB).toEqual(fromA);
    const ch = (fromA.channels as { name: string; version: number; history: { from: number | null; to: number }[] }[]).find((c) => c.name === 'machines')!;
    const history = [...ch.history].reverse(); // oldest first
    expect(history.length).toBeGreaterThanOrEqual(1);
    expect(history.length).toBeLessThanOrEqual([ra, rb].filter((r) => r.status === 200).length);
    expect(history[0]!.from).toBeNull();
    for (let i = 1; i < history.length; i++) expect(history[i]!.from).toBe(history[i - 1]!.to);
    expect(ch.version).toBe(history[history.length - 1]!.to);

    // both A and B run dispatchers; each move's delivery must reach the receiver exactly once
    const until = Date.now() + 10_000;
    while (receiver.got.filter((g) => g.event === 'channel.moved').length < history.length && Date.now() < until) await new Promise((r) => setTimeout(r, 100));
    await new Promise((r) => setTimeout(r, 1_500)); // time for a duplicate to show up, if there were one
    const moved = receiver.got.filter((g) => g.event === 'channel.moved');
    expect(moved).toHaveLength(history.length);
    expect(new Set(moved.map((g) => g.delivery)).size).toBe(moved.length);
  }, 30_000);
});
