/**
 * Rate limits shared by several app instances: two apps (two testApp() contexts, each with its own
 * limiters and pools) over ONE database count one allowance together, because both store their hits
 * in PostgreSQL (server/http/pg-rate-limit-store.ts). Also the store itself (fixed windows, decrement,
 * reset, sweep) and the expired-session sweep under its advisory lock (server/auth/session-sweep.ts).
 * Header checks: Retry-After in delay-seconds (RFC 9110 §10.2.3); RateLimit `r=` remaining quota
 * (IETF draft-ietf-httpapi-ratelimit-headers-08, as express-rate-limit's `standardHeaders: 'draft-8'`).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import pg from 'pg';
import { testApp } from '../support/app';
import { createPerson, ORIGIN, signIn, uniqueEmail } from '../support/accounts';
import { PgRateLimitStore } from '../../server/http/pg-rate-limit-store';
import { SESSION_SWEEP_LOCK, startSessionSweep } from '../../server/auth/session-sweep';
import type { Options } from 'express-rate-limit';

type T = Awaited<ReturnType<typeof testApp>>;
const LIMITS = { AUTH_RATE_LIMIT: '5', API_V1_RATE_LIMIT: '6', API_V1_RATE_WINDOW_SECONDS: '120' };

describe('two app instances over one database', () => {
  let a: T;
  let b: T;
  let cookie: string;
  beforeAll(async () => {
    a = await testApp({ label: 'rl_shared', seed: true, env: LIMITS });
    b = await testApp({ label: 'rl_shared_b', env: { ...LIMITS, DATABASE_URL: a.databaseUrl } });
    const email = uniqueEmail('limits');
    await createPerson({ email, password: 'a long enough password', teams: { 'ui-motion': 'viewer' } });
    cookie = await signIn(a.app, email, 'a long enough password');
  });
  afterAll(async () => {
    await b?.close();
    await a?.close();
  });

  it('failed sign-ins split over A and B reach the 429 at the shared total, with Retry-After', async () => {
    const remaining: string[] = [];
    for (let i = 0; i < 5; i++) {
      const app = i % 2 === 0 ? a.app : b.app;
      const res = await request(app).post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email: 'nobody@corvid-lantern.test', password: `guess ${i}` });
      expect(res.status).toBe(401);
      remaining.push(/r=(\d+)/.exec(String(res.headers.ratelimit))?.[1] ?? '?');
    }
    // one count: the allowance goes down by one per attempt whichever instance answered
    expect(remaining).toEqual(['4', '3', '2', '1', '0']);
    for (const app of [b.app, a.app]) {
      const res = await request(app).post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email: 'nobody@corvid-lantern.test', password: 'again' });
      expect(res.status).toBe(429);
      expect(res.body.error.code).toBe('rate_limited');
      const retryAfter = Number(res.headers['retry-after']);
      expect(Number.isInteger(retryAfter)).toBe(true);
      expect(retryAfter).toBeGreaterThan(0);
      expect(retryAfter).toBeLessThanOrEqual(15 * 60); // AUTH_RATE_WINDOW_MINUTES default 15
    }
  });

  it('concurrent /api/v1 requests over both instances: exactly the limit pass, the rest are 429', async () => {
    const results = await Promise.all(
      Array.from({ length: 10 }, (_, i) => request(i % 2 ? a.app : b.app).get('/api/v1/whoami').set('Cookie', cookie)),
    );
    const statuses = results.map((r) => r.status).sort();
    expect(statuses.filter((s) => s === 200)).toHaveLength(6);
    expect(statuses.filter((s) => s === 429)).toHaveLength(4);
    for (const r of results.filter((x) => x.status === 429)) {
      expect(Number(r.headers['retry-after'])).toBeGreaterThan(0);
      expect(Number(r.headers['retry-after'])).toBeLessThanOrEqual(120);
    }
  });

  it('the session cookie from A works on B (sessions are rows in PostgreSQL)', async () => {
    // /api/v1 is exhausted for this person; the older /api routes are not counted by it
    const me = await request(b.app).get('/api/auth/me').set('Cookie', cookie);
    expect(me.status).toBe(200);
  });
});

describe('PgRateLimitStore', () => {
  let t: T;
  beforeAll(async () => {
    t = await testApp({ label: 'rl_store' });
  });
  afterAll(async () => t?.close());

  const store = (windowMs: number, prefix = 'unit:') => {
    const s = new PgRateLimitStore({ databaseUrl: t.databaseUrl, prefix });
    s.init({ windowMs } as Options);
    return s;
  };

  it('counts in fixed windows, decrements, resets, and starts a new window after reset time', async () => {
    const s = store(400);
    const first = await s.increment('k');
    expect(first.totalHits).toBe(1);
    expect(first.resetTime!.getTime() - Date.now()).toBeGreaterThan(0);
    expect(first.resetTime!.getTime() - Date.now()).toBeLessThanOrEqual(400 + 50);
    const second = await s.increment('k');
    expect(second.totalHits).toBe(2);
    expect(second.resetTime!.getTime()).toBe(first.resetTime!.getTime()); // fixed window: reset time does not move
    await s.decrement('k');
    expect((await s.get('k'))?.totalHits).toBe(1);
    await new Promise((r) => setTimeout(r, 500));
    expect(await s.get('k')).toBeUndefined(); // the window has ended
    const next = await s.increment('k');
    expect(next.totalHits).toBe(1);
    expect(next.resetTime!.getTime()).toBeGreaterThan(first.resetTime!.getTime());
    await s.resetKey('k');
    expect(await s.get('k')).toBeUndefined();
  });

  it('prefixes keep limiters apart; 50 concurrent increments count 50', async () => {
    const x = store(60_000, 'x:');
    const y = store(60_000, 'y:');
    const hits = await Promise.all(Array.from({ length: 50 }, () => x.increment('same')));
    expect(hits.map((h) => h.totalHits).sort((p, q) => p - q)).toEqual(Array.from({ length: 50 }, (_, i) => i + 1));
    expect((await y.increment('same')).totalHits).toBe(1);
  });

  it('sweep deletes rows whose window ended and keeps the others', async () => {
    const short = store(100, 'short:');
    const long = store(60_000, 'long:');
    await short.increment('gone');
    await long.increment('kept');
    await new Promise((r) => setTimeout(r, 200));
    expect(await short.sweep()).toBeGreaterThanOrEqual(1);
    const { rows } = await t.ctx.pgPool.query<{ key: string }>("SELECT key FROM rate_limits WHERE key IN ('short:gone', 'long:kept')");
    expect(rows.map((r) => r.key)).toEqual(['long:kept']);
  });
});

describe('expired-session sweep', () => {
  let t: T;
  let other: T;
  beforeAll(async () => {
    t = await testApp({ label: 'session_sweep', seed: true });
    other = await testApp({ label: 'session_sweep_b', env: { DATABASE_URL: t.databaseUrl } });
  });
  afterAll(async () => {
    await other?.close();
    await t?.close();
  });

  it('deletes expired sessions only, skips a turn while another instance holds the lock', async () => {
    const userId = await createPerson({ email: uniqueEmail('sweep'), password: 'a long enough password', teams: { 'ui-motion': 'viewer' } });
    await t.ctx.pgPool.query(
      "INSERT INTO auth_session (id, user_id, expires_at) VALUES ('expired-1', $1, now() - interval '1 hour'), ('live-1', $1, now() + interval '1 hour')",
      [userId],
    );
    const sweepA = startSessionSweep(t.ctx, { everyMs: 3_600_000 });
    const sweepB = startSessionSweep(other.ctx, { everyMs: 3_600_000 });
    const holder = new pg.Client({ connectionString: t.databaseUrl });
    await holder.connect();
    try {
      await holder.query('SELECT pg_advisory_lock($1)', [SESSION_SWEEP_LOCK]);
      expect(await sweepA.runOnce()).toBe(false);
      expect((await t.ctx.pgPool.query("SELECT 1 FROM auth_session WHERE id = 'expired-1'")).rowCount).toBe(1);
      await holder.query('SELECT pg_advisory_unlock($1)', [SESSION_SWEEP_LOCK]);
      const ran = await Promise.all([sweepA.runOnce(), sweepB.runOnce()]);
      expect(ran.filter(Boolean).length).toBeGreaterThanOrEqual(1);
      const { rows } = await t.ctx.pgPool.query<{ id: string }>("SELECT id FROM auth_session WHERE id IN ('expired-1', 'live-1')");
      expect(rows.map((r) => r.id)).toEqual(['live-1']);
    } finally {
      await holder.end();
      await sweepA.stop();
      await sweepB.stop();
    }
  });
});
