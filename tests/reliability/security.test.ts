/**
 * Security review, as tests against the real app (docs/security.md explains each point):
 *   - session fixation: signing in never keeps a session id the browser brought (OWASP Session
 *     Management Cheat Sheet, "Renew the Session ID After Any Privilege Level Change");
 *   - CSRF: cookie-authenticated writes from another origin, or with no Origin/Referer, are refused
 *     (OWASP CSRF Prevention Cheat Sheet, "Verifying Origin with standard headers"); the session cookie is
 *     HttpOnly, SameSite=Lax, Path=/, and Secure behind an https public URL (RFC 6265 §4.1.2.5–6, RFC 6265bis SameSite);
 *   - the authorization matrix lists every API route (checked independently of the matrix test), and every
 *     team route refuses anonymous callers and members of another team;
 *   - session ids, service tokens, reset links and invitation links are stored as SHA-256 digests: the
 *     plaintext appears in no column of any row;
 *   - secrets never reach the log: the logger's output during sign-in, a token request, a reset and a
 *     bearer request is captured and searched for every secret used;
 *   - stored objects are content-addressed (`sha256/<64 hex>`), and download names in Content-Disposition
 *     are sanitised even when a profile is named like a path with quotes and CR/LF;
 *   - helmet's security headers are present.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { readFileSync } from 'node:fs';
import { Writable } from 'node:stream';
import { createHash, randomBytes } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { freshDatabaseUrl } from '../support/database';
import { ORIGIN, createPerson, sessionCookie, signIn, teamId, uniqueEmail, waitForMail, linkIn } from '../support/accounts';
import { listRoutes } from '../support/route-walk';
import { loadConfig } from '../../server/config';
import { createContext, closeContext, type AppContext } from '../../server/context';
import { createApp } from '../../server/app';
import { ensureBucket } from '../../server/storage/s3-client';
import { seedDemoIfEmpty } from '../../server/seed/demo';
import { createLogger, REDACT_PATHS } from '../../server/logger';
import { createCurve, createPack } from '../../server/packs/packs.service';
import { DEMO_PACKS } from '../../server/seed/demo-packs';
import { proposeAndWait } from './support/proposals';

const PASSWORD = 'security password 12';
const sha256 = (s: string) => createHash('sha256').update(s, 'utf8').digest('hex');
/** The session cookie a browser keeps: the last tangentry_session Set-Cookie of the answer wins (RFC 6265 §5.3). */
const lastSessionCookie = (setCookie: unknown) => {
  const list = (Array.isArray(setCookie) ? setCookie : [setCookie]).filter((c): c is string => typeof c === 'string' && c.startsWith('tangentry_session='));
  return list[list.length - 1]!.split(';')[0]!;
};
/** supertest parser that keeps the raw bytes. */
const raw = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(c));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
};

describe('security review', () => {
  let ctx: AppContext;
  let app: ReturnType<typeof createApp>;
  const logged: string[] = [];
  let team = '';
  let adminEmail = '';

  beforeAll(async () => {
    const databaseUrl = await freshDatabaseUrl('security');
    const config = loadConfig({ ...process.env, NODE_ENV: 'test', LOG_LEVEL: 'debug', DATABASE_URL: databaseUrl, PUBLIC_URL: ORIGIN, AUTH_RATE_LIMIT: '100000' });
    // capture everything the app logs, at debug level
    const capture = new Writable({ write(chunk, _enc, cb) { logged.push(String(chunk)); cb(); } });
    ctx = createContext(config, createLogger('debug', capture));
    await ensureBucket(ctx.s3, config.s3.bucket);
    await seedDemoIfEmpty(ctx);
    app = createApp(ctx);
    team = await teamId('ui-motion');
    adminEmail = uniqueEmail('sec-admin');
    await createPerson({ email: adminEmail, password: PASSWORD, teams: { 'ui-motion': 'admin' } });
  }, 60_000);
  afterAll(async () => ctx && closeContext(ctx));

  const rowsAsText = async (table: string) =>
    (await ctx.sequelize.query<{ j: string }>(`SELECT row_to_json(t)::text AS j FROM "${table}" t`, { type: QueryTypes.SELECT })).map((r) => r.j);
  const allTables = async () =>
    (await ctx.sequelize.query<{ name: string }>("SELECT table_name::text AS name FROM information_schema.tables WHERE table_schema = 'public' AND table_type = 'BASE TABLE'", { type: QueryTypes.SELECT })).map((r) => r.name);

  describe('sessions', () => {
    it('session fixation: a session id brought to sign-in is never the one issued, and stays the other person’s', async () => {
      const attackerEmail = uniqueEmail('sec-attacker');
      await createPerson({ email: attackerEmail, password: PASSWORD, teams: { 'gameplay-feel': 'viewer' } });
      const attacker = await signIn(app, attackerEmail, PASSWORD);
      // 1. a made-up id planted in the browser
      const planted = `tangentry_session=${randomBytes(20).toString('hex')}`;
      const a = await request(app).post('/api/auth/sign-in').set('Origin', ORIGIN).set('Cookie', planted).send({ email: adminEmail, password: PASSWORD });
      expect(a.status).toBe(200);
      const issuedA = lastSessionCookie(a.headers['set-cookie']);
      expect(issuedA).not.toBe(planted);
      // 2. the attacker's own valid session planted in the victim's browser
      const b = await request(app).post('/api/auth/sign-in').set('Origin', ORIGIN).set('Cookie', attacker).send({ email: adminEmail, password: PASSWORD });
      expect(b.status).toBe(200);
      const issuedB = lastSessionCookie(b.headers['set-cookie']);
      expect(issuedB).not.toBe(attacker);
      expect(issuedB).not.toBe(issuedA);
      // the planted session did not become the victim's: it is still the attacker, and the made-up one is nobody
      expect((await request(app).get('/api/auth/me').set('Cookie', attacker)).body.user.email).toBe(attackerEmail);
      expect((await request(app).get('/api/auth/me').set('Cookie', planted)).status).toBe(401);
      expect((await request(app).get('/api/auth/me').set('Cookie', issuedB)).body.user.email).toBe(adminEmail);
      // session ids are long random values (lucia 3.2.2 createSession: generateIdFromEntropySize(25), 25 random bytes as 40 base32 characters)
      expect(issuedA.split('=')[1]!.length).toBeGreaterThanOrEqual(20);
    });

    it('cookie flags: HttpOnly, SameSite=Lax, Path=/, no Secure over http; Secure when the public URL is https', async () => {
      const res = await request(app).post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email: adminEmail, password: PASSWORD });
      const set = (res.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith('tangentry_session='))!;
      expect(set).toMatch(/;\s*HttpOnly/i);
      expect(set).toMatch(/;\s*SameSite=Lax/i);
      expect(set).toMatch(/;\s*Path=\//i);
      expect(set).not.toMatch(/;\s*Secure/i);
      // the same app configuration behind https
      const https = loadConfig({ ...process.env, NODE_ENV: 'test', LOG_LEVEL: 'silent', DATABASE_URL: ctx.config.databaseUrl, PUBLIC_URL: 'https://tangentry.corvid-lantern.test', AUTH_RATE_LIMIT: '100000' });
      expect(https.session.secureCookie).toBe(true);
      const c2 = createContext(https);
      try {
        const app2 = createApp(c2);
        const r2 = await request(app2).post('/api/auth/sign-in').set('Origin', 'https://tangentry.corvid-lantern.test').send({ email: adminEmail, password: PASSWORD });
        const set2 = (r2.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith('tangentry_session='))!;
        expect(set2).toMatch(/;\s*Secure/i);
        expect(set2).toMatch(/;\s*HttpOnly/i);
        expect(r2.headers['strict-transport-security']).toMatch(/max-age=\d+/);
      } finally {
        await closeContext(c2);
        // models follow the last context made: bind them back to a context of this file's database
        const old = ctx;
        ctx = createContext(old.config, old.logger);
        app = createApp(ctx);
        await closeContext(old);
      }
    });

    it('CSRF: a cookie-authenticated write from another origin, a null origin or none at all is refused; same origin passes', async () => {
      const cookie = await signIn(app, adminEmail, PASSWORD);
      const url = `/api/teams/${team}/packs`;
      const before = (await request(app).get(url).set('Cookie', cookie)).body.packs.length;
      for (const [origin, code] of [['https://evil.example', 'cross_origin'], ['http://127.0.0.1:3000.evil.example', 'cross_origin'], ['null', 'cross_origin'], [undefined, 'origin_required']] as const) {
        let req = request(app).post(url).set('Cookie', cookie);
        if (origin) req = req.set('Origin', origin);
        const res = await req.send({ name: `csrf ${origin}` });
        expect(res.status, `${origin}: ${JSON.stringify(res.body)}`).toBe(403);
        expect(res.body.error.code).toBe(code);
      }
      // a Referer from elsewhere (no Origin) is refused too
      const viaReferer = await request(app).post(url).set('Cookie', cookie).set('Referer', 'https://evil.example/page').send({ name: 'csrf referer' });
      expect(viaReferer.status).toBe(403);
      // a form-encoded cross-site post (what a plain HTML form sends) is refused before anything reads it
      const form = await request(app).post(url).set('Cookie', cookie).set('Origin', 'https://evil.example').type('form').send('name=csrf+form');
      expect(form.status).toBe(403);
      expect((await request(app).get(url).set('Cookie', cookie)).body.packs.length).toBe(before);
      const ok = await request(app).post(url).set('Cookie', cookie).set('Origin', ORIGIN).send({ name: `Same origin ${randomBytes(3).toString('hex')}` });
      expect(ok.status).toBe(201);
    });
  });

  describe('authorization', () => {
    it('the authorization matrix lists exactly the routes the app has (read from the matrix file itself)', () => {
      const matrixText = readFileSync('tests/api/authorization-matrix.test.ts', 'utf8');
      const listed = new Set([...matrixText.matchAll(/route:\s*'((?:GET|POST|PUT|PATCH|DELETE|ALL) \/api\/[^']*)'/g)].map((m) => m[1]!));
      const inApp = listRoutes(app).filter((r) => r.split(' ')[1]!.startsWith('/api/'));
      expect(inApp.length).toBeGreaterThan(30);
      expect(inApp.filter((r) => !listed.has(r)), 'routes missing from the matrix').toEqual([]);
      // and the matrix test fails on a missing route: it compares both directions
      expect(matrixText).toMatch(/inApp\.filter\(\(r\) => !inMatrix\.includes\(r\)\)/);
      expect(matrixText).toMatch(/inMatrix\.filter\(\(r\) => !inApp\.includes\(r\)\)/);
    });

    it('every team route refuses anonymous callers (401) and members of another team (404)', async () => {
      const outsiderEmail = uniqueEmail('sec-outsider');
      await createPerson({ email: outsiderEmail, password: PASSWORD, teams: { 'gameplay-feel': 'admin' } });
      const outsider = await signIn(app, outsiderEmail, PASSWORD);
      const teamRoutes = listRoutes(app).filter((r) => r.split(' ')[1]!.startsWith('/api/teams/:teamId'));
      expect(teamRoutes.length).toBeGreaterThan(20);
      for (const route of teamRoutes) {
        const [method, path] = route.split(' ') as [string, string];
        const url = path.replace(':teamId', team).replace(/:(\w+)/g, (_m, p: string) => (p === 'pack' ? 'menu-transitions' : p === 'number' ? '1' : p === 'channel' ? 'shipping' : '00000000-0000-0000-0000-000000000001'));
        const m = method.toLowerCase() as 'get';
        const anon = await request(app)[m](url).set('Origin', ORIGIN).send({});
        expect(anon.status, `${route} anonymous`).toBe(401);
        const other = await request(app)[m](url).set('Origin', ORIGIN).set('Cookie', outsider).send({});
        expect(other.status, `${route} another team's admin`).toBe(404);
      }
    }, 60_000);
  });

  describe('secrets at rest', () => {
    it('session ids: auth_session keeps only the SHA-256 of the cookie value; the id is in no row of any table, and the session still works', async () => {
      const email = uniqueEmail('sec-session-hash');
      await createPerson({ email, password: PASSWORD, teams: { 'ui-motion': 'viewer' } });
      const cookie = await signIn(app, email, PASSWORD);
      const id = cookie.split('=')[1]!;
      expect(id).toMatch(/^[a-z2-7]{40}$/); // lucia 3.2.2: 25 random bytes, base32 lower case, no padding
      for (const table of await allTables()) {
        for (const row of await rowsAsText(table)) expect(row.includes(id), `${table} holds the session id`).toBe(false);
      }
      const stored = await ctx.sequelize.query<{ user_id: string; expires_at: string }>('SELECT user_id, expires_at FROM auth_session WHERE id = $1', { bind: [sha256(id)], type: QueryTypes.SELECT });
      expect(stored).toHaveLength(1);
      const me = await request(app).get('/api/auth/me').set('Cookie', cookie);
      expect(me.status).toBe(200);
      expect(me.body.user.email).toBe(email);
      expect(stored[0]!.user_id).toBe(me.body.user.id);
      // the digest itself is not a session: presenting what the table holds gets nobody in
      expect((await request(app).get('/api/auth/me').set('Cookie', `tangentry_session=${sha256(id)}`)).status).toBe(401);
      // a session past half its life is extended (lucia updates the row it found by the digest) and keeps working
      await ctx.sequelize.query("UPDATE auth_session SET expires_at = now() + interval '1 hour' WHERE id = $1", { bind: [sha256(id)] });
      const extended = await request(app).get('/api/auth/me').set('Cookie', cookie);
      expect(extended.status).toBe(200);
      expect(String(extended.headers['set-cookie'])).toContain(`tangentry_session=${id};`);
      const [after] = await ctx.sequelize.query<{ hours: string }>('SELECT extract(epoch from expires_at - now()) / 3600 AS hours FROM auth_session WHERE id = $1', { bind: [sha256(id)], type: QueryTypes.SELECT });
      expect(Number(after!.hours)).toBeGreaterThan(2);
      // sign-out deletes the row
      expect((await request(app).post('/api/auth/sign-out').set('Origin', ORIGIN).set('Cookie', cookie)).status).toBe(204);
      expect(await ctx.sequelize.query('SELECT 1 FROM auth_session WHERE id = $1', { bind: [sha256(id)], type: QueryTypes.SELECT })).toHaveLength(0);
      expect((await request(app).get('/api/auth/me').set('Cookie', cookie)).status).toBe(401);
    });

    it('service tokens: only the SHA-256 of the secret is stored; the token string is in no row of any table', async () => {
      const cookie = await signIn(app, adminEmail, PASSWORD);
      const res = await request(app).post(`/api/teams/${team}/tokens`).set('Origin', ORIGIN).set('Cookie', cookie).send({ name: 'security check' });
      expect(res.status).toBe(201);
      const token = res.body.secret as string;
      const m = /^tgt_([0-9a-f]{32})_([A-Za-z0-9_-]{43})$/.exec(token);
      expect(m, token).not.toBeNull();
      const secret = m![2]!;
      for (const table of await allTables()) {
        for (const row of await rowsAsText(table)) {
          expect(row.includes(secret), `${table} holds the token secret`).toBe(false);
          expect(row.includes(token)).toBe(false);
        }
      }
      expect((await rowsAsText('service_tokens')).some((r) => r.includes(sha256(secret)))).toBe(true);
      // the list never shows it either
      const list = await request(app).get(`/api/teams/${team}/tokens`).set('Cookie', cookie);
      expect(JSON.stringify(list.body)).not.toContain(secret);
      // and it works as a bearer token
      expect((await request(app).get(`/api/teams/${team}/packs`).set('Authorization', `Bearer ${token}`)).status).toBe(200);
    });

    it('reset and invitation links: once the mail is sent, the link secret is in no table (only its SHA-256)', async () => {
      const cookie = await signIn(app, adminEmail, PASSWORD);
      expect((await request(app).post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email: adminEmail })).status).toBe(202);
      const reset = linkIn(await waitForMail(adminEmail, /Reset your Tangentry password/), '/reset-password').pathname.split('/').pop()!;
      const invitee = uniqueEmail('sec-invitee');
      expect((await request(app).post(`/api/teams/${team}/invitations`).set('Origin', ORIGIN).set('Cookie', cookie).send({ email: invitee, role: 'viewer' })).status).toBe(201);
      const invite = linkIn(await waitForMail(invitee, /invited/), '/invite').pathname.split('/').pop()!;
      // the outbox drops a message's body once it is delivered (a pending message must keep its link)
      for (let i = 0; i < 50; i++) {
        const [p] = await ctx.sequelize.query<{ n: string }>('SELECT count(*)::text AS n FROM mail_outbox WHERE sent_at IS NULL', { type: QueryTypes.SELECT });
        if (p!.n === '0') break;
        await new Promise((r) => setTimeout(r, 100));
      }
      for (const [kind, link, table] of [['rst', reset, 'password_resets'], ['inv', invite, 'invitations']] as const) {
        const m = new RegExp(`^${kind}_([0-9a-f]{32})_([A-Za-z0-9_-]{43})$`).exec(link);
        expect(m, link).not.toBeNull();
        const secret = m![2]!;
        for (const t of await allTables()) {
          for (const row of await rowsAsText(t)) expect(row.includes(secret), `${t} holds the ${kind} secret`).toBe(false);
        }
        expect((await rowsAsText(table)).some((r) => r.includes(sha256(secret))), `${table} keeps the digest`).toBe(true);
      }
    });
  });

  describe('logs', () => {
    it('redaction: every secret-bearing field the app could log is censored', () => {
      const lines: string[] = [];
      const log = createLogger('debug', new Writable({ write(c, _e, cb) { lines.push(String(c)); cb(); } }));
      const SECRET = `s3cr3t-${randomBytes(6).toString('hex')}`;
      log.info({ req: { headers: { authorization: `Bearer ${SECRET}`, cookie: `tangentry_session=${SECRET}`, 'x-api-key': SECRET } }, res: { headers: { 'set-cookie': SECRET } } }, 'request');
      log.info({ body: { password: SECRET, currentPassword: SECRET, newPassword: SECRET, token: SECRET } }, 'body');
      log.info({ req: { body: { password: SECRET } }, user: { passwordHash: SECRET }, token: SECRET, secret: SECRET }, 'nested');
      log.info({ config: { databaseUrl: SECRET, smtpUrl: SECRET, s3: { secretAccessKey: SECRET } } }, 'config');
      log.info({ headers: { authorization: SECRET, cookie: SECRET } }, 'headers');
      expect(lines.length).toBe(5);
      for (const l of lines) {
        expect(l, l).not.toContain(SECRET);
        expect(l).toContain('[redacted]');
      }
      expect(REDACT_PATHS).toContain('req.headers.authorization');
    });

    it('during sign-in, a token request, a bearer request, a reset and a failed request, no secret reaches the log', async () => {
      logged.length = 0;
      const email = uniqueEmail('sec-logs');
      const password = `log-check-${randomBytes(8).toString('hex')}`;
      await createPerson({ email, password, teams: { 'ui-motion': 'admin' } });
      const signedIn = await request(app).post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email, password });
      const cookie = sessionCookie(signedIn.headers['set-cookie']);
      const wrong = await request(app).post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email, password: `${password}-wrong` });
      expect(wrong.status).toBe(401);
      const tok = await request(app).post(`/api/teams/${team}/tokens`).set('Origin', ORIGIN).set('Cookie', cookie).send({ name: 'log check' });
      const token = tok.body.secret as string;
      await request(app).get(`/api/teams/${team}/packs`).set('Authorization', `Bearer ${token}`);
      await request(app).get(`/api/teams/${team}/packs`).set('Authorization', `Bearer ${token}x`);
      await request(app).post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email });
      const reset = linkIn(await waitForMail(email, /Reset your Tangentry password/), '/reset-password').pathname.split('/').pop()!;
      await request(app).post('/api/auth/password').set('Origin', ORIGIN).set('Cookie', cookie).send({ currentPassword: password, newPassword: `${password}-new` });
      const text = logged.join('');
      for (const s of [password, `${password}-new`, token, token.split('_')[2]!, cookie.split('=')[1]!, reset, reset.split('_')[2]!]) {
        expect(text.includes(s), `the log holds a secret (${s.slice(0, 6)}…)`).toBe(false);
      }
    }, 30_000);
  });

  describe('stored objects and downloads', () => {
    it('object keys are content-addressed; a profile named like a path with quotes and CR/LF downloads under a sanitised name', async () => {
      const cookie = await signIn(app, adminEmail, PASSWORD);
      const evil = '../../etc/passwd"; filename*=UTF-8\'\'evil.sh\r\nX-Injected: 1 ✓';
      const prof = await request(app).post(`/api/teams/${team}/profiles`).set('Origin', ORIGIN).set('Cookie', cookie)
        .send({ name: evil, tolerance: { mode: 'absolute', value: 1e-3 }, kernel: 'hermite', layout: 'adaptive', encoding: 'f32' });
      // a profile name may be refused outright; when it is accepted, its downloads must still be safe
      expect(prof.status, JSON.stringify(prof.body)).toBeLessThan(500);
      const evilAccepted = prof.status === 201;
      const pack = await createPack(team, { name: 'Evil "name" ../..', description: '', frameRate: 60, tags: [] });
      await createCurve({ kind: 'anonymous' }, team, pack.slug, DEMO_PACKS[0]!.curves[0]!);
      const packUrl = `/api/teams/${team}/packs/${pack.slug}`;
      const v = await proposeAndWait(app, cookie, packUrl, 'security download names');
      expect(v.number, JSON.stringify(v.body)).not.toBeNull();
      const version = (await request(app).get(`${packUrl}/versions/${v.number}`).set('Cookie', cookie)).body.version;
      const keys = (await ctx.sequelize.query<{ key: string }>('SELECT key FROM version_artifacts', { type: QueryTypes.SELECT })).map((r) => r.key);
      expect(keys.length).toBeGreaterThan(0);
      for (const k of keys) expect(k).toMatch(/^sha256\/[0-9a-f]{64}$/);
      expect(version.source.key).toMatch(/^sha256\/[0-9a-f]{64}$/);
      if (evilAccepted) expect((version.artifacts as { profileName: string | null }[]).some((a) => a.profileName === evil), 'the evil profile was baked').toBe(true);
      for (const a of version.artifacts as { id: string; sha256: string; key: string }[]) {
        expect(a.key).toBe(`sha256/${a.sha256}`);
        const res = await request(app).get(`${packUrl}/versions/${v.number}/artifacts/${a.id}`).set('Cookie', cookie).buffer(true).parse(raw);
        expect(res.status).toBe(200);
        const cd = String(res.headers['content-disposition']);
        expect(cd, cd).toMatch(/^attachment; filename="[A-Za-z0-9_.-]+"$/);
        expect(cd).not.toMatch(/[\r\n/\\]|\.\.\//);
        expect(res.headers['x-injected']).toBeUndefined();
        // the bytes are what the key says
        expect(createHash('sha256').update(res.body as Buffer).digest('hex')).toBe(a.sha256);
      }
    }, 60_000);
  });

  describe('headers', () => {
    it('helmet security headers on API answers; no X-Powered-By', async () => {
      const res = await request(app).get('/api/health');
      const h = res.headers;
      expect(h['content-security-policy']).toMatch(/default-src 'self'/);
      expect(h['content-security-policy']).toMatch(/frame-ancestors 'none'/);
      expect(h['content-security-policy']).toMatch(/object-src 'none'/);
      expect(h['x-content-type-options']).toBe('nosniff');
      expect(h['x-frame-options']).toBe('SAMEORIGIN');
      expect(h['referrer-policy']).toBe('no-referrer');
      expect(h['cross-origin-opener-policy']).toBe('same-origin');
      expect(h['cross-origin-resource-policy']).toBe('same-origin');
      expect(h['x-dns-prefetch-control']).toBe('off');
      expect(h['x-powered-by']).toBeUndefined();
      // http public URL: no HSTS (it would pin a plain-http origin); https: see the cookie-flags test
      expect(h['strict-transport-security']).toBeUndefined();
    });
  });
});
