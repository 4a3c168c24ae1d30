import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, sessionCookie, signIn, uniqueEmail } from '../support/accounts';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../../server/seed/demo-accounts';
import { sha256Hex } from '../../server/auth/secret-token';

type T = Awaited<ReturnType<typeof testApp>>;

describe('sign-in, sessions and sign-out (lucia over PostgreSQL)', () => {
  let t: T;
  beforeAll(async () => {
    t = await testApp({ label: 'auth', seed: true, env: { TANGENTRY_EMBEDDED: 'true' } });
  });
  afterAll(async () => t?.close());

  it('signs in a demo account; the cookie is HttpOnly, SameSite=Lax, persistent, not Secure over http', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email: 'ADMIN@corvid-lantern.test', password: DEMO_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body.user.email).toBe('admin@corvid-lantern.test');
    expect(res.body.teams.map((x: { name: string; role: string }) => `${x.name}:${x.role}`)).toEqual(['Gameplay Feel:admin', 'UI Motion:admin']);
    const raw = (res.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith('tangentry_session='))!;
    expect(raw).toMatch(/HttpOnly/i);
    expect(raw).toMatch(/SameSite=Lax/i);
    expect(raw).toMatch(/Path=\//);
    expect(raw).toMatch(/Expires=|Max-Age=/i);
    expect(raw).not.toMatch(/Secure/i);
    const me = await request(t.app).get('/api/auth/me').set('Cookie', sessionCookie(res.headers['set-cookie']));
    expect(me.status).toBe(200);
    expect(me.body.user.name).toBe('Wren Halloway');
  });

  it('one person holds different roles in different teams (the demo animator)', async () => {
    const cookie = await signIn(t.app, 'animator@corvid-lantern.test', DEMO_PASSWORD);
    const me = await request(t.app).get('/api/auth/me').set('Cookie', cookie);
    const roles = Object.fromEntries(me.body.teams.map((x: { slug: string; role: string }) => [x.slug, x.role]));
    expect(roles).toEqual({ 'ui-motion': 'animator', 'gameplay-feel': 'viewer' });
    expect(DEMO_ACCOUNTS.map((a) => a.email)).toEqual(['admin', 'lead', 'animator', 'engineer', 'viewer'].map((r) => `${r}@corvid-lantern.test`));
  });

  it('stores Argon2id hashes with the OWASP minimum m=19456 KiB, t=2, p=1', async () => {
    const [rows] = await t.ctx.sequelize.query(`SELECT password_hash FROM auth_user WHERE email = 'lead@corvid-lantern.test'`);
    // PHC string format of the reference argon2 implementation: $argon2id$v=19$m=…,t=…,p=…$salt$hash
    expect((rows as { password_hash: string }[])[0]!.password_hash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
  });

  it('wrong password and unknown address get the same 401 answer', async () => {
    const a = await request(t.app).post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email: 'admin@corvid-lantern.test', password: 'not-the-password' });
    const b = await request(t.app).post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email: 'nobody@corvid-lantern.test', password: 'not-the-password' });
    expect(a.status).toBe(401);
    expect(b.status).toBe(401);
    expect(a.body).toEqual(b.body);
    expect(a.body.error.message).toMatch(/do not match/);
    expect(a.headers['set-cookie']).toBeUndefined();
  });

  it('rejects a malformed body with fields named', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email: 'not-an-address', password: '' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields).sort()).toEqual(['email', 'password']);
  });

  it('sign out ends this session only; sign out everywhere ends all of them', async () => {
    const email = uniqueEmail('sessions');
    await createPerson({ email, password: 'correct horse battery', teams: { 'ui-motion': 'viewer' } });
    const s1 = await signIn(t.app, email, 'correct horse battery');
    const s2 = await signIn(t.app, email, 'correct horse battery');
    const s3 = await signIn(t.app, email, 'correct horse battery');
    const out = await request(t.app).post('/api/auth/sign-out').set('Origin', ORIGIN).set('Cookie', s1);
    expect(out.status).toBe(204);
    expect(String(out.headers['set-cookie'])).toMatch(/tangentry_session=;/);
    expect((await request(t.app).get('/api/auth/me').set('Cookie', s1)).status).toBe(401);
    expect((await request(t.app).get('/api/auth/me').set('Cookie', s2)).status).toBe(200);
    expect((await request(t.app).post('/api/auth/sign-out-everywhere').set('Origin', ORIGIN).set('Cookie', s2)).status).toBe(204);
    expect((await request(t.app).get('/api/auth/me').set('Cookie', s2)).status).toBe(401);
    expect((await request(t.app).get('/api/auth/me').set('Cookie', s3)).status).toBe(401);
  });

  it('extends a session that is used past half its life, and drops an expired one', async () => {
    const email = uniqueEmail('extend');
    await createPerson({ email, password: 'correct horse battery', teams: { 'ui-motion': 'viewer' } });
    const cookie = await signIn(t.app, email, 'correct horse battery');
    // auth_session keys a session by the SHA-256 of the cookie's id (server/auth/hashed-session-adapter.ts)
    const id = cookie.split('=')[1]!;
    // an hour left of 14 days: lucia extends when less than half of the lifetime remains
    await t.ctx.sequelize.query(`UPDATE auth_session SET expires_at = now() + interval '1 hour' WHERE id = $1`, { bind: [sha256Hex(id)] });
    const used = await request(t.app).get('/api/auth/me').set('Cookie', cookie);
    expect(used.status).toBe(200);
    expect(String(used.headers['set-cookie'])).toMatch(/tangentry_session=/);
    const [rows] = await t.ctx.sequelize.query(`SELECT extract(epoch from expires_at - now()) / 3600 AS hours FROM auth_session WHERE id = $1`, { bind: [sha256Hex(id)] });
    expect(Number((rows as { hours: string }[])[0]!.hours)).toBeGreaterThan(24 * 13);

    await t.ctx.sequelize.query(`UPDATE auth_session SET expires_at = now() - interval '1 minute' WHERE id = $1`, { bind: [sha256Hex(id)] });
    const expired = await request(t.app).get('/api/auth/me').set('Cookie', cookie);
    expect(expired.status).toBe(401);
    expect(String(expired.headers['set-cookie'])).toMatch(/tangentry_session=;/);
  });

  it('refuses cookie-authenticated writes from another origin or with no origin at all', async () => {
    const cookie = await signIn(t.app, 'viewer@corvid-lantern.test', DEMO_PASSWORD);
    const evil = await request(t.app).patch('/api/auth/me').set('Origin', 'https://evil.example').set('Cookie', cookie).send({ name: 'Hijacked' });
    expect(evil.status).toBe(403);
    expect(evil.body.error.code).toBe('cross_origin');
    const none = await request(t.app).patch('/api/auth/me').set('Cookie', cookie).send({ name: 'Hijacked' });
    expect(none.status).toBe(403);
    expect(none.body.error.code).toBe('origin_required');
    const byReferer = await request(t.app).patch('/api/auth/me').set('Referer', `${ORIGIN}/profile`).set('Cookie', cookie).send({ name: 'Bram O.' });
    expect(byReferer.status).toBe(200);
    // the request's own host counts as same origin (a deployment reached by another name)
    const ownHost = await request(t.app).patch('/api/auth/me').set('Host', 'curves.internal:8080').set('Origin', 'http://curves.internal:8080').set('Cookie', cookie).send({ name: 'Bram Oduya' });
    expect(ownHost.status).toBe(200);
    const loginCsrf = await request(t.app).post('/api/auth/sign-in').set('Origin', 'https://evil.example').send({ email: 'viewer@corvid-lantern.test', password: DEMO_PASSWORD });
    expect(loginCsrf.status).toBe(403);
  });

  it('profile: name change validates with a field message; password change ends the other sessions', async () => {
    const email = uniqueEmail('profile');
    await createPerson({ email, password: 'first password 1', teams: { 'gameplay-feel': 'engineer' } });
    const a = await signIn(t.app, email, 'first password 1');
    const b = await signIn(t.app, email, 'first password 1');
    const blank = await request(t.app).patch('/api/auth/me').set('Origin', ORIGIN).set('Cookie', a).send({ name: '  ' });
    expect(blank.status).toBe(400);
    expect(blank.body.error.fields.name).toMatch(/Name/);
    const wrong = await request(t.app).post('/api/auth/password').set('Origin', ORIGIN).set('Cookie', a).send({ currentPassword: 'nope', newPassword: 'second password 2' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields.currentPassword).toBeTruthy();
    const short = await request(t.app).post('/api/auth/password').set('Origin', ORIGIN).set('Cookie', a).send({ currentPassword: 'first password 1', newPassword: 'short' });
    expect(short.body.error.fields.newPassword).toMatch(/12 characters/);
    const ok = await request(t.app).post('/api/auth/password').set('Origin', ORIGIN).set('Cookie', a).send({ currentPassword: 'first password 1', newPassword: 'second password 2' });
    expect(ok.status).toBe(204);
    const renewed = sessionCookie(ok.headers['set-cookie']);
    expect((await request(t.app).get('/api/auth/me').set('Cookie', renewed)).status).toBe(200);
    expect((await request(t.app).get('/api/auth/me').set('Cookie', b)).status).toBe(401);
    await expect(signIn(t.app, email, 'first password 1')).rejects.toThrow(/401/);
    await signIn(t.app, email, 'second password 2');
  });

  it('lists the demo accounts on the embedded default', async () => {
    const res = await request(t.app).get('/api/auth/demo-accounts');
    expect(res.body.enabled).toBe(true);
    expect(res.body.password).toBe(DEMO_PASSWORD);
    expect(res.body.accounts.map((a: { role: string }) => a.role)).toEqual(['admin', 'lead', 'animator', 'engineer', 'viewer']);
  });
});

describe('when DATABASE_URL points at a real database (not the embedded default)', () => {
  let t: T;
  beforeAll(async () => {
    t = await testApp({ label: 'auth_external', seed: true, env: { TANGENTRY_EMBEDDED: 'false' } });
  });
  afterAll(async () => t?.close());

  it('neither seeds nor lists demo accounts', async () => {
    const res = await request(t.app).get('/api/auth/demo-accounts');
    expect(res.body).toEqual({ enabled: false });
    const [rows] = await t.ctx.sequelize.query('SELECT count(*)::int AS n FROM auth_user');
    expect((rows as { n: number }[])[0]!.n).toBe(0);
  });

  it('marks the cookie Secure behind an https public URL', async () => {
    const s = await testApp({ label: 'auth_https', seed: true, env: { TANGENTRY_EMBEDDED: 'true', PUBLIC_URL: 'https://curves.corvid-lantern.test' } });
    try {
      const res = await request(s.app).post('/api/auth/sign-in').set('Origin', 'https://curves.corvid-lantern.test').send({ email: 'lead@corvid-lantern.test', password: DEMO_PASSWORD });
      expect(res.status).toBe(200);
      expect(String(res.headers['set-cookie'])).toMatch(/; Secure/);
    } finally {
      await s.close();
    }
  });
});

describe('rate limits (express-rate-limit)', () => {
  let t: T;
  beforeAll(async () => {
    t = await testApp({ label: 'auth_rate', env: { AUTH_RATE_LIMIT: '3' } });
  });
  afterAll(async () => t?.close());

  it('answers 429 after the allowed sign-in attempts, and separately for reset requests', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++) {
      statuses.push((await request(t.app).post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email: 'x@corvid-lantern.test', password: 'guess' + i })).status);
    }
    expect(statuses).toEqual([401, 401, 401, 429]);
    const r: number[] = [];
    for (let i = 0; i < 4; i++) r.push((await request(t.app).post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email: 'x@corvid-lantern.test' })).status);
    expect(r).toEqual([202, 202, 202, 429]);
  });
});
