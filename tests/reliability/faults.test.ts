/**
 * Faults, with real services of this file's own (so stopping them disturbs no other test file):
 *   - the S3 fake stopped before and during a proposal → a clear 503 storage_unavailable (or a failed
 *     background bake), no version; once it is back, the same proposal succeeds;
 *   - PostgreSQL stopped (pg_ctl stop -m fast) under a running app → requests answer 503 JSON
 *     database_unavailable, never hang or crash; started again → the same app instance answers 200
 *     (same session cookie), without a restart;
 *   - the mail catcher down → an invitation still succeeds (201), the message waits in the mail outbox
 *     with the error, and is delivered by the outbox sender once the catcher is back — not lost.
 * Each scenario makes and closes its own app context (models are bound to the last context made).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { chmodSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { randomBytes } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { startS3Fake, type S3Fake } from '../../storage-fake/s3';
import { startMailCatcher, readCaughtMessages, type MailCatcher } from '../../storage-fake/mail-catcher';
import { startEmbeddedPostgres, type EmbeddedPostgres } from '../../scripts/services/postgres';
import { createSequelize } from '../../server/db/sequelize';
import { migrate } from '../../server/db/migrate';
import { loadConfig } from '../../server/config';
import { createContext, closeContext, type AppContext } from '../../server/context';
import { createApp } from '../../server/app';
import { ensureBucket } from '../../server/storage/s3-client';
import { seedDemoIfEmpty } from '../../server/seed/demo';
import { createCurve, createPack } from '../../server/packs/packs.service';
import { DEMO_PACKS } from '../../server/seed/demo-packs';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail } from '../support/accounts';
import { proposeAndWait } from './support/proposals';

const PASSWORD = 'faults password 1';
const BUCKET = 'tangentry-faults';

function workDir(label: string): string {
  const d = mkdtempSync(join(process.env.TEST_WORK_DIR ?? tmpdir(), `${label}-`));
  chmodSync(d, 0o755); // the postgres user must reach a cluster's data folder
  return d;
}
const portOf = (url: string) => Number(new URL(url).port);

async function signedInAdmin(app: Parameters<typeof signIn>[0], label: string, role: 'admin' | 'lead' = 'admin') {
  const email = uniqueEmail(label);
  const id = await createPerson({ email, password: PASSWORD, teams: { 'ui-motion': role } });
  return { id, email, cookie: await signIn(app, email, PASSWORD) };
}

describe('S3 fake stopped during a proposal', () => {
  let dir = '';
  let s3: S3Fake;
  let t: Awaited<ReturnType<typeof testApp>>;
  let cookie = '';
  let packUrl = '';

  beforeAll(async () => {
    dir = workDir('faults-s3');
    s3 = await startS3Fake({ directory: join(dir, 's3'), bucket: BUCKET });
    t = await testApp({ label: 'faults_s3', seed: true, env: { S3_ENDPOINT: s3.endpoint, S3_BUCKET: BUCKET, AUTH_RATE_LIMIT: '100000' } });
    cookie = (await signedInAdmin(t.app, 'faults-s3')).cookie;
    const team = await teamId('ui-motion');
    const pack = await createPack(team, { name: `Faults ${randomBytes(3).toString('hex')}`, description: '', frameRate: 60, tags: [] });
    for (const c of DEMO_PACKS[0]!.curves) await createCurve({ kind: 'anonymous' }, team, pack.slug, c);
    packUrl = `/api/teams/${team}/packs/${pack.slug}`;
  }, 60_000);
  afterAll(async () => {
    await t?.close();
    await s3?.close().catch(() => undefined);
    rmSync(dir, { recursive: true, force: true });
  });

  const versionCount = async () => ((await request(t.app).get(`${packUrl}/versions`).set('Cookie', cookie)).body.versions as unknown[]).length;

  it('stopped before: 503 storage_unavailable (or a failed bake), no version; back again: the retry succeeds', async () => {
    await s3.close();
    const down = await proposeAndWait(t.app, cookie, packUrl, 'while the bucket is down');
    expect(down.number, JSON.stringify(down.body)).toBeNull();
    if (down.status === 503) {
      expect(down.body.error).toMatchObject({ code: 'storage_unavailable' });
      expect(String((down.body.error as { message: string }).message)).toMatch(/no version|nothing was proposed|Try again/i);
    } else {
      expect(down.status).toBe(202); // a background bake that failed: it says why
      expect(JSON.stringify(down.failure)).toMatch(/.{10,}/);
    }
    expect(await versionCount()).toBe(0);

    s3 = await startS3Fake({ directory: join(dir, 's3'), bucket: BUCKET, port: portOf(s3.endpoint) });
    const back = await proposeAndWait(t.app, cookie, packUrl, 'after the bucket is back');
    expect(back.number, JSON.stringify(back.body)).toBe(1);
    // every artifact of the version is readable
    const v = await request(t.app).get(`${packUrl}/versions/1`).set('Cookie', cookie);
    for (const a of v.body.version.artifacts as { id: string; sha256: string }[]) {
      const got = await request(t.app).get(`${packUrl}/versions/1/artifacts/${a.id}`).set('Cookie', cookie).buffer(true);
      expect(got.status).toBe(200);
      expect(got.headers['x-content-sha256']).toBe(a.sha256);
    }
  }, 60_000);

  it('stopped while the objects are being written: no half version, and a retry after it is back succeeds', async () => {
    const before = await versionCount();
    const objects = () => { try { return readdirSync(join(dir, 's3', BUCKET), { recursive: true }).length; } catch { return 0; } };
    const start = objects();
    const pending = proposeAndWait(t.app, cookie, packUrl, `mid-write ${randomBytes(3).toString('hex')}`);
    // stop the bucket as soon as the first new object of this proposal lands (or after 2 s)
    const until = Date.now() + 2_000;
    while (objects() === start && Date.now() < until) await new Promise((r) => setTimeout(r, 5));
    await s3.close();
    const outcome = await pending;
    s3 = await startS3Fake({ directory: join(dir, 's3'), bucket: BUCKET, port: portOf(s3.endpoint) });
    if (outcome.number === null) {
      expect([503, 202]).toContain(outcome.status);
      expect(await versionCount()).toBe(before);
      const retry = await proposeAndWait(t.app, cookie, packUrl, 'retry after mid-write stop');
      expect(retry.number).toBe(before + 1);
    } else {
      // the proposal won the race: then it is whole
      expect(outcome.number).toBe(before + 1);
    }
    const n = await versionCount();
    const v = await request(t.app).get(`${packUrl}/versions/${n}`).set('Cookie', cookie);
    for (const a of v.body.version.artifacts as { id: string }[]) {
      const got = await request(t.app).get(`${packUrl}/versions/${n}/artifacts/${a.id}`).set('Cookie', cookie).buffer(true);
      expect(got.status).toBe(200);
    }
  }, 60_000);
});

describe('PostgreSQL restarted under a running server', () => {
  let dir = '';
  let pgs: EmbeddedPostgres;
  let ctx: AppContext;
  let app: ReturnType<typeof createApp>;
  let cookie = '';
  let team = '';

  beforeAll(async () => {
    dir = workDir('faults-pg');
    pgs = await startEmbeddedPostgres({ dataDir: join(dir, 'pg'), database: 'tangentry_restart', throwaway: true });
    const url = pgs.url();
    const seq = createSequelize(url, 2);
    await migrate(seq, url);
    await seq.close();
    const config = loadConfig({ ...process.env, NODE_ENV: 'test', LOG_LEVEL: 'silent', DATABASE_URL: url, PUBLIC_URL: ORIGIN, AUTH_RATE_LIMIT: '100000' });
    ctx = createContext(config);
    await ensureBucket(ctx.s3, config.s3.bucket);
    await seedDemoIfEmpty(ctx);
    app = createApp(ctx);
    cookie = (await signedInAdmin(app, 'faults-pg')).cookie;
    team = await teamId('ui-motion');
  }, 120_000);
  afterAll(async () => {
    if (ctx) await closeContext(ctx).catch(() => undefined);
    pgs?.stop();
    rmSync(dir, { recursive: true, force: true });
  });

  it('stopped: 503 database_unavailable JSON for reads and writes; started again: the same app answers 200', async () => {
    expect((await request(app).get(`/api/teams/${team}/packs`).set('Cookie', cookie)).status).toBe(200);
    pgs.stop(); // pg_ctl stop -m fast -w
    const started = Date.now();
    const reads = await request(app).get(`/api/teams/${team}/packs`).set('Cookie', cookie);
    const write = await request(app).post(`/api/teams/${team}/packs`).set('Origin', ORIGIN).set('Cookie', cookie).send({ name: 'During the outage' });
    const signInDown = await request(app).post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email: 'x@corvid-lantern.test', password: 'whatever it is' });
    for (const [what, res] of [['read', reads], ['write', write], ['sign-in', signInDown]] as const) {
      expect(res.status, `${what}: ${JSON.stringify(res.body)}`).toBe(503);
      expect(res.headers['content-type']).toMatch(/application\/json/);
      expect(res.body.error.code).toBe('database_unavailable');
      expect(res.headers['retry-after']).toBe('5');
    }
    // the build-server API (rate limited through a PostgreSQL store) answers in RFC 9457 problem details
    const v1Down = await request(app).get(`/api/v1/teams/${team}/packs`).set('Cookie', cookie);
    expect(v1Down.status, JSON.stringify(v1Down.body)).toBe(503);
    expect(v1Down.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(v1Down.body.code).toBe('database_unavailable');
    expect(Date.now() - started, 'answered promptly, not after a long hang').toBeLessThan(20_000);
    // health says which part is down (and does not itself fail)
    const health = await request(app).get('/api/health');
    expect(health.status).toBeLessThan(600);
    expect(health.headers['content-type']).toMatch(/application\/json/);

    pgs = await startEmbeddedPostgres({ dataDir: join(dir, 'pg'), database: 'tangentry_restart', port: pgs.port, throwaway: true });
    // the pools drop their dead connections and open new ones: allow a few attempts
    let res = await request(app).get(`/api/teams/${team}/packs`).set('Cookie', cookie);
    for (let i = 0; i < 10 && res.status !== 200; i++) {
      expect(res.status, JSON.stringify(res.body)).toBe(503);
      await new Promise((r) => setTimeout(r, 300));
      res = await request(app).get(`/api/teams/${team}/packs`).set('Cookie', cookie);
    }
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const created = await request(app).post(`/api/teams/${team}/packs`).set('Origin', ORIGIN).set('Cookie', cookie).send({ name: 'After the outage' });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    // nothing from the outage was stored
    const names = (await request(app).get(`/api/teams/${team}/packs`).set('Cookie', cookie)).body.packs.map((p: { name: string }) => p.name);
    expect(names).toContain('After the outage');
    expect(names).not.toContain('During the outage');
  }, 120_000);
});

describe('mail catcher down', () => {
  let dir = '';
  let catcher: MailCatcher;
  let t: Awaited<ReturnType<typeof testApp>>;
  let cookie = '';
  let team = '';

  beforeAll(async () => {
    dir = workDir('faults-mail');
    catcher = await startMailCatcher({ directory: join(dir, 'mail') });
    t = await testApp({ label: 'faults_mail', seed: true, env: { SMTP_URL: catcher.url, MAIL_CATCHER_DIR: catcher.directory, AUTH_RATE_LIMIT: '100000' } });
    cookie = (await signedInAdmin(t.app, 'faults-mail')).cookie;
    team = await teamId('ui-motion');
  }, 60_000);
  afterAll(async () => {
    await t?.close();
    await catcher?.close().catch(() => undefined);
    rmSync(dir, { recursive: true, force: true });
  });

  const outboxRow = async (to: string) =>
    (await t.ctx.sequelize.query<{ attempts: number; last_error: string | null; sent_at: Date | null }>(
      'SELECT attempts, last_error, sent_at FROM mail_outbox WHERE to_address = :to', { replacements: { to }, type: QueryTypes.SELECT },
    ))[0];

  it('with the catcher up, an invitation mail is delivered at once through the outbox', async () => {
    const to = uniqueEmail('faults-invite-up');
    const res = await request(t.app).post(`/api/teams/${team}/invitations`).set('Origin', ORIGIN).set('Cookie', cookie).send({ email: to, role: 'viewer' });
    expect(res.status).toBe(201);
    const until = Date.now() + 10_000;
    while (!readCaughtMessages(catcher.directory).some((m) => m.to.includes(to)) && Date.now() < until) await new Promise((r) => setTimeout(r, 100));
    expect(readCaughtMessages(catcher.directory).filter((m) => m.to.includes(to))).toHaveLength(1);
    expect((await outboxRow(to))?.sent_at).not.toBeNull();
  });

  it('with the catcher down, the invitation succeeds, the mail waits with the error, and is sent once the catcher is back', async () => {
    const port = portOf(catcher.url);
    await catcher.close();
    const to = uniqueEmail('faults-invite-down');
    const res = await request(t.app).post(`/api/teams/${team}/invitations`).set('Origin', ORIGIN).set('Cookie', cookie).send({ email: to, role: 'viewer' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const pending = await request(t.app).get(`/api/teams/${team}/invitations`).set('Cookie', cookie);
    expect(pending.body.invitations.map((i: { email: string }) => i.email)).toContain(to);
    // the first attempt fails (connection refused) and is recorded
    let row = await outboxRow(to);
    for (let i = 0; i < 50 && !row?.last_error; i++) {
      await new Promise((r) => setTimeout(r, 100));
      row = await outboxRow(to);
    }
    expect(row, 'the message is in the outbox').toBeDefined();
    expect(row!.sent_at).toBeNull();
    expect(row!.attempts).toBeGreaterThanOrEqual(1);
    expect(row!.last_error).toMatch(/ECONNREFUSED|connect/i);

    catcher = await startMailCatcher({ directory: join(dir, 'mail'), port });
    // the outbox sender retries (first retry 5 s after the failure) and delivers it, exactly once
    const until = Date.now() + 30_000;
    while (!readCaughtMessages(catcher.directory).some((m) => m.to.includes(to)) && Date.now() < until) await new Promise((r) => setTimeout(r, 200));
    const got = readCaughtMessages(catcher.directory).filter((m) => m.to.includes(to));
    expect(got).toHaveLength(1);
    expect(got[0]!.subject).toMatch(/invited/);
    expect(got[0]!.text).toMatch(/\/invite\/inv_/);
    row = await outboxRow(to);
    expect(row!.sent_at).not.toBeNull();
    expect(row!.last_error).toBeNull();
  }, 60_000);
});
