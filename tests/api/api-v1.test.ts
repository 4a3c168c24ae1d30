/**
 * The build-server API (/api/v1) over the real app: real PostgreSQL, the S3 fake through
 * @aws-sdk/client-s3. Every route with a service token and with a session; scopes; conditional GET
 * (RFC 9110 §13.1.2 If-None-Match, §15.4.5 304); checksums with node:crypto; RFC 9457 problem details;
 * presigned redirects; the rate limit (Retry-After, RFC 9110 §10.2.3).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createHash, randomBytes } from 'node:crypto';
import { DeleteObjectCommand, GetObjectCommand } from '@aws-sdk/client-s3';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail } from '../support/accounts';
import { createToken, revokeToken } from '../../server/tokens/tokens.service';
import { review, type Storage } from '../../server/versions/versions.service';
import { getPack } from '../../server/packs/packs.service';
import { listCurves } from '../../server/packs/packs.repository';
import { listProfiles } from '../../server/profiles/profiles.repository';
import { buildVersion } from '../../server/versions/build-artifacts';
import { insertVersion } from '../../server/versions/versions.repository';
import { putContentAddressed } from '../../server/storage/content-store';
import { release } from '../../server/channels/channels.service';
import type { ManifestDto } from '../../shared/schemas/api-v1';

const PASSWORD = 'api v1 password 1';
const sha256 = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');
const someone = { kind: 'anonymous' } as const;
/**
 * A stored version, made by the steps a proposal runs (bake every target with the shared baker, store
 * each object content-addressed, then insert the rows), called directly so this file needs no bake queue.
 */
async function storeVersion(storage: Storage, team: string, slug: string, changelog: string, userId: string) {
  const pack = await getPack(someone, team, slug);
  const curves = await listCurves(pack.id);
  const built = buildVersion(pack, curves.map((c) => c.document), (await listProfiles(team)).map((x) => x.profile));
  const artifacts = [];
  for (const o of built.objects) {
    const stored = await putContentAddressed(storage.s3, storage.bucket, o.bytes, o.mediaType);
    artifacts.push({ profileName: o.profileName, format: o.format, fileName: o.fileName, mediaType: o.mediaType, key: stored.key, sha256: stored.sha256, size: stored.size });
  }
  return insertVersion({ packId: pack.id, changelog, proposedBy: userId, curveCount: curves.length, source: { key: artifacts[0]!.key, sha256: artifacts[0]!.sha256, size: artifacts[0]!.size }, bakeSummary: built.summary, artifacts });
}

/** supertest: collect any body as bytes. */
const binary = (res: request.Response, cb: (err: Error | null, body: Buffer) => void) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(c));
  stream.on('end', () => cb(null, Buffer.concat(chunks)));
};

describe('build-server API v1', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  const bucket = `api-v1-${randomBytes(4).toString('hex')}`;
  let team = '';
  let otherTeam = '';
  let token = '';
  let limitedToken = '';
  let revoked = '';
  let viewer = '';
  let outsider = '';
  let adminId = '';

  const bearer = (secret: string) => ({ Authorization: `Bearer ${secret}` });
  const get = (url: string, headers: Record<string, string> = {}) => request(t.app).get(url).set(headers);
  const v1 = (path: string) => `/api/v1/teams/${team}${path}`;

  beforeAll(async () => {
    // a bucket of its own: one test deletes an object to prove a 304 never reads the bucket
    t = await testApp({ label: 'api-v1', seed: true, env: { S3_BUCKET: bucket } });
    team = await teamId('ui-motion');
    otherTeam = await teamId('gameplay-feel');
    adminId = await createPerson({ email: uniqueEmail('v1-admin'), password: PASSWORD, teams: { 'ui-motion': 'admin' } });
    const viewerEmail = uniqueEmail('v1-viewer');
    await createPerson({ email: viewerEmail, password: PASSWORD, name: 'Vera Viewer', teams: { 'ui-motion': 'viewer' } });
    viewer = await signIn(t.app, viewerEmail, PASSWORD);
    const outsiderEmail = uniqueEmail('v1-outsider');
    await createPerson({ email: outsiderEmail, password: PASSWORD, teams: { 'gameplay-feel': 'admin' } });
    outsider = await signIn(t.app, outsiderEmail, PASSWORD);
    token = (await createToken(team, { name: 'build farm' }, adminId)).secret;
    limitedToken = (await createToken(team, { name: 'audio fades only', packSlugs: ['audio-fades'] }, adminId)).secret;
    const r = await createToken(team, { name: 'old' }, adminId);
    await revokeToken(team, r.token.id);
    revoked = r.secret;
    const storage = { s3: t.ctx.s3, bucket };
    await storeVersion(storage, team, 'menu-transitions', 'First cut.', adminId);
    await review(someone, team, 'menu-transitions', 1, adminId, { decision: 'approve', comment: '' });
    await release(someone, team, 'menu-transitions', 'shipping', 1, adminId);
    await storeVersion(storage, team, 'menu-transitions', 'Second cut.', adminId);
  }, 120_000);
  afterAll(async () => t?.close());

  describe('whoami', () => {
    it('a token sees its one team', async () => {
      const res = await get('/api/v1/whoami', bearer(token));
      expect(res.status).toBe(200);
      expect(res.body).toEqual({ principal: { kind: 'token', name: 'build farm' }, teams: [{ id: team, slug: 'ui-motion', name: 'UI Motion' }] });
    });
    it('a person sees every team they belong to', async () => {
      const res = await get('/api/v1/whoami', { Cookie: viewer });
      expect(res.status).toBe(200);
      expect(res.body).toEqual({ principal: { kind: 'user', name: 'Vera Viewer' }, teams: [{ id: team, slug: 'ui-motion', name: 'UI Motion' }] });
    });
  });

  describe('packs', () => {
    it('lists the team’s packs with latest version and channels, for a token and a session alike', async () => {
      const a = await get(v1('/packs'), bearer(token));
      const b = await get(v1('/packs'), { Cookie: viewer });
      expect(a.status).toBe(200);
      expect(b.body).toEqual(a.body);
      const menu = a.body.packs.find((p: { slug: string }) => p.slug === 'menu-transitions');
      expect(menu).toMatchObject({ name: expect.any(String), frameRate: expect.any(Number), tags: expect.any(Array), archived: false, latestVersion: 2, channels: [{ name: 'shipping', version: 1 }] });
      const other = a.body.packs.find((p: { slug: string }) => p.slug !== 'menu-transitions');
      expect(other).toMatchObject({ latestVersion: null, channels: [] });
      expect(a.headers['cache-control']).toBe('no-cache');
    });
    it('a token limited to packs sees only those', async () => {
      const res = await get(v1('/packs'), bearer(limitedToken));
      expect(res.body.packs.map((p: { slug: string }) => p.slug)).toEqual(['audio-fades']);
    });
  });

  describe('channel read', () => {
    it('answers the channel’s version and manifest, no-cache with an ETag, and 304 when it matches', async () => {
      const res = await get(v1('/packs/menu-transitions/channels/shipping'), bearer(token));
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ pack: 'menu-transitions', channel: 'shipping', version: 1, manifest: { pack: 'menu-transitions', version: 1, state: 'approved' } });
      expect(res.headers['cache-control']).toBe('no-cache');
      const etag = res.headers.etag as string;
      expect(etag).toMatch(/^"[0-9a-f]{32}"$/);
      const again = await get(v1('/packs/menu-transitions/channels/shipping'), { ...bearer(token), 'If-None-Match': etag });
      expect(again.status).toBe(304);
      expect(again.text).toBe('');
      expect(again.headers.etag).toBe(etag);
      // a session gets the same representation, so the same tag
      expect((await get(v1('/packs/menu-transitions/channels/shipping'), { Cookie: viewer, 'If-None-Match': etag })).status).toBe(304);
      // weak comparison (RFC 9110 §13.1.2): a W/ prefix and a list still match; "*" matches any
      expect((await get(v1('/packs/menu-transitions/channels/shipping'), { ...bearer(token), 'If-None-Match': `"nope", W/${etag}` })).status).toBe(304);
      expect((await get(v1('/packs/menu-transitions/channels/shipping'), { ...bearer(token), 'If-None-Match': '*' })).status).toBe(304);
      expect((await get(v1('/packs/menu-transitions/channels/shipping'), { ...bearer(token), 'If-None-Match': '"stale"' })).status).toBe(200);
    });

    it('the ETag changes when the channel moves', async () => {
      const before = (await get(v1('/packs/menu-transitions/channels/shipping'), bearer(token))).headers.etag;
      await review(someone, team, 'menu-transitions', 2, adminId, { decision: 'approve', comment: '' });
      await release(someone, team, 'menu-transitions', 'shipping', 2, adminId);
      const moved = await get(v1('/packs/menu-transitions/channels/shipping'), { ...bearer(token), 'If-None-Match': before as string });
      expect(moved.status).toBe(200);
      expect(moved.body.version).toBe(2);
      expect(moved.headers.etag).not.toBe(before);
      await release(someone, team, 'menu-transitions', 'shipping', 1, adminId);
      expect((await get(v1('/packs/menu-transitions/channels/shipping'), { ...bearer(token), 'If-None-Match': before as string })).status).toBe(304);
    });

    it('an unknown channel is a 404 problem', async () => {
      const res = await get(v1('/packs/menu-transitions/channels/nightly'), bearer(token));
      expect(res.status).toBe(404);
      expect(res.body).toMatchObject({ status: 404, code: 'not_found', detail: expect.stringContaining('nightly') });
    });
  });

  describe('version manifest and downloads', () => {
    let manifest: ManifestDto;

    it('describes curves, targets and artifacts (size, SHA-256, URL), for a token and a session', async () => {
      const res = await get(v1('/packs/menu-transitions/versions/1'), bearer(token));
      expect(res.status).toBe(200);
      expect(res.headers['cache-control']).toBe('no-cache');
      expect(res.headers.etag).toMatch(/^"[0-9a-f]{32}"$/);
      manifest = res.body.manifest;
      expect((await get(v1('/packs/menu-transitions/versions/1'), { Cookie: viewer })).body.manifest).toEqual(manifest);
      expect(manifest).toMatchObject({ pack: 'menu-transitions', version: 1, changelog: 'First cut.', source: { size: expect.any(Number) } });
      // the seeded team's four targets, by file stem (server/versions/build-artifacts.ts fileStem)
      expect(manifest.targets.map((x) => [x.name, x.target])).toEqual([['Console', 'console'], ['Handheld', 'handheld'], ['Mobile', 'mobile'], ['Web', 'web']]);
      const handheld = manifest.targets[1]!;
      expect(handheld).toMatchObject({ kernel: 'hermite', layout: 'uniform', encoding: 'unorm16', tolerance: { value: 2e-3 } });
      expect(handheld.artifacts.map((a) => a.format)).toEqual(expect.arrayContaining(['json', 'binary']));
      expect(handheld.artifacts.find((a) => a.format === 'binary')!.url).toBe(v1('/packs/menu-transitions/versions/1/artifacts/handheld/binary'));
      expect(manifest.targets[3]!.artifacts.map((a) => a.format)).toContain('css');
      // curve names in order: those of the stored source
      const src = JSON.parse((await get(manifest.source.url, bearer(token)).buffer(true).parse(binary)).body.toString('utf8'));
      expect(manifest.curves).toEqual(src.curves.map((c: { name: string }) => c.name));
      expect(manifest.curves.length).toBeGreaterThan(0);
    });

    it('a version manifest answers 304 to its ETag, and a new one after a review changes its state', async () => {
      const first = await get(v1('/packs/menu-transitions/versions/1'), bearer(token));
      expect((await get(v1('/packs/menu-transitions/versions/1'), { ...bearer(token), 'If-None-Match': first.headers.etag as string })).status).toBe(304);
      const v2 = await get(v1('/packs/menu-transitions/versions/2'), bearer(token));
      expect(v2.body.manifest.state).toBe('approved');
    });

    it('every artifact downloads with the manifest’s SHA-256 (node:crypto), immutable caching and a strong ETag', async () => {
      let n = 0;
      for (const target of manifest.targets) {
        for (const a of target.artifacts) {
          const res = await get(a.url, n % 2 ? { Cookie: viewer } : bearer(token)).buffer(true).parse(binary);
          expect(res.status, a.url).toBe(200);
          const body = res.body as Buffer;
          expect(body.length).toBe(a.size);
          expect(sha256(body)).toBe(a.sha256);
          expect(res.headers.etag).toBe(`"${a.sha256}"`);
          expect(res.headers['x-content-sha256']).toBe(a.sha256);
          expect(res.headers['cache-control']).toBe('private, max-age=31536000, immutable');
          expect(res.headers['content-type']).toContain(a.mediaType);
          expect(res.headers['content-disposition']).toBe(`attachment; filename="menu-transitions-v1-${a.fileName}"`);
          n++;
        }
      }
      expect(n).toBeGreaterThanOrEqual(9);
    });

    it('the source downloads with its SHA-256 and answers 304', async () => {
      const res = await get(manifest.source.url, bearer(token)).buffer(true).parse(binary);
      expect(res.status).toBe(200);
      expect(sha256(res.body as Buffer)).toBe(manifest.source.sha256);
      expect(res.headers.etag).toBe(`"${manifest.source.sha256}"`);
      expect(res.headers['cache-control']).toBe('private, max-age=31536000, immutable');
      const again = await get(manifest.source.url, { Cookie: viewer, 'If-None-Match': `"${manifest.source.sha256}"` });
      expect(again.status).toBe(304);
      expect(again.headers.etag).toBe(`"${manifest.source.sha256}"`);
    });

    it('304 on a matching If-None-Match without reading the bucket (the object is gone, the 304 still comes)', async () => {
      const a = manifest.targets[0]!.artifacts.find((x) => x.format === 'json')!;
      await t.ctx.s3.send(new DeleteObjectCommand({ Bucket: bucket, Key: `sha256/${a.sha256}` }));
      const cached = await get(a.url, { ...bearer(token), 'If-None-Match': `"${a.sha256}"` });
      expect(cached.status).toBe(304);
      expect(cached.headers['x-content-sha256']).toBe(a.sha256);
      // without the tag the server must read the bucket, and says storage failed as a problem detail
      const fresh = await get(a.url, bearer(token));
      expect(fresh.status).toBe(503);
      expect(fresh.headers['content-type']).toContain('application/problem+json');
      expect(fresh.body.code).toBe('storage_unavailable');
    });

    it('an unknown target or format is a 404 that names what the version has', async () => {
      const noTarget = await get(v1('/packs/menu-transitions/versions/1/artifacts/toaster/json'), bearer(token));
      expect(noTarget.status).toBe(404);
      expect(noTarget.body.detail).toContain('handheld');
      const noFormat = await get(v1('/packs/menu-transitions/versions/1/artifacts/handheld/css'), bearer(token));
      expect(noFormat.status).toBe(404);
      expect(noFormat.body.detail).toMatch(/json, binary/);
      expect((await get(v1('/packs/menu-transitions/versions/9/artifacts/handheld/json'), bearer(token))).status).toBe(404);
    });
  });

  describe('scopes and problem details', () => {
    const expectProblem = (res: request.Response, status: number, code: string) => {
      expect(res.status).toBe(status);
      expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
      // RFC 9457 §3.1 members, plus our stable code
      expect(res.body).toMatchObject({ type: expect.stringMatching(/^http:\/\/127\.0\.0\.1:3000\/api-reference#problem-/), title: expect.any(String), status, detail: expect.any(String), code });
      expect(res.body.type).toBe(`http://127.0.0.1:3000/api-reference#problem-${code}`);
    };

    it('a token limited to packs gets 404 for every other pack, on every pack route', async () => {
      for (const path of ['/packs/menu-transitions/channels/shipping', '/packs/menu-transitions/versions/1', '/packs/menu-transitions/versions/1/source', '/packs/menu-transitions/versions/1/artifacts/handheld/binary']) {
        expectProblem(await get(v1(path), bearer(limitedToken)), 404, 'not_found');
      }
    });

    it('no credentials, a revoked token or a malformed header: 401 problem details', async () => {
      for (const path of ['/api/v1/whoami', v1('/packs'), v1('/packs/menu-transitions/versions/1/artifacts/handheld/binary')]) {
        expectProblem(await get(path), 401, 'unauthenticated');
        expectProblem(await get(path, bearer(revoked)), 401, 'unauthenticated');
        expectProblem(await get(path, { Authorization: 'Token abc' }), 401, 'unauthenticated');
        expectProblem(await get(path, bearer('tgt_not_a_real_token')), 401, 'unauthenticated');
      }
    });

    it('a member of another team gets 404 (team ids cannot be probed); a token of that team too', async () => {
      for (const path of ['/packs', '/packs/menu-transitions/channels/shipping', '/packs/menu-transitions/versions/1', '/packs/menu-transitions/versions/1/source']) {
        expectProblem(await get(v1(path), { Cookie: outsider }), 404, 'not_found');
      }
      const otherToken = (await createToken(otherTeam, { name: 'other team' }, adminId)).secret;
      expectProblem(await get(v1('/packs'), bearer(otherToken)), 404, 'not_found');
      expect((await get(`/api/v1/teams/${otherTeam}/packs`, { Cookie: outsider })).status).toBe(200);
    });

    it('a malformed path parameter is a 400 problem with errors per field', async () => {
      const res = await get(v1('/packs/menu-transitions/versions/first'), bearer(token));
      expectProblem(res, 400, 'invalid_request');
      expect(res.body.errors).toEqual([{ field: 'number', detail: expect.stringMatching(/^number: /) }]);
      const bad = await get(v1('/packs/Menu_Transitions/versions/0/artifacts/hand%20held/json'), bearer(token));
      expectProblem(bad, 400, 'invalid_request');
      expect(bad.body.errors.map((e: { field: string }) => e.field).sort()).toEqual(['number', 'pack', 'target']);
    });

    it('an unknown /api/v1 path is a 404 problem; the older /api routes keep their error shape', async () => {
      expectProblem(await get('/api/v1/nothing-here', bearer(token)), 404, 'not_found');
      const old = await get('/api/nothing-here', bearer(token));
      expect(old.status).toBe(404);
      expect(old.body).toEqual({ error: { code: 'not_found', message: expect.any(String) } });
    });

    it('tokens are read-only on v1 as everywhere (no write routes exist)', async () => {
      const res = await request(t.app).post(v1('/packs')).set(bearer(token)).set('Origin', ORIGIN).send({});
      expectProblem(res, 404, 'not_found');
    });

    it('answers RateLimit headers (IETF draft 8) under the high default', async () => {
      const res = await get('/api/v1/whoami', bearer(token));
      expect(res.headers['ratelimit-policy']).toMatch(/q=1000000/);
      expect(res.headers.ratelimit).toMatch(/r=\d+/);
    });
  });

  describe('presigned redirects', () => {
    let r: Awaited<ReturnType<typeof testApp>>;
    beforeAll(async () => {
      // the same database and bucket, configured to redirect downloads
      r = await testApp({ label: 'api-v1-presigned', env: { DATABASE_URL: t.databaseUrl, S3_BUCKET: bucket, TANGENTRY_DOWNLOAD_REDIRECT: 'presigned', TANGENTRY_DOWNLOAD_REDIRECT_SECONDS: '30' } });
    });
    afterAll(async () => r?.close());

    it('302 to a presigned S3 URL; following it gives the bytes with the manifest’s SHA-256', async () => {
      const manifest: ManifestDto = (await request(r.app).get(v1('/packs/menu-transitions/versions/2')).set(bearer(token))).body.manifest;
      const entries = [...manifest.targets[1]!.artifacts.map((a) => ({ url: a.url, sha256: a.sha256, size: a.size })), { url: manifest.source.url, sha256: manifest.source.sha256, size: manifest.source.size }];
      for (const a of entries) {
        const res = await request(r.app).get(a.url).set(bearer(token)).redirects(0);
        expect(res.status).toBe(302);
        expect(res.headers['cache-control']).toBe('no-store');
        const location = res.headers.location as string;
        expect(location).toMatch(/X-Amz-Signature=/);
        expect(location).toMatch(/X-Amz-Expires=30/);
        const followed = await fetch(location);
        expect(followed.status).toBe(200);
        const bytes = new Uint8Array(await followed.arrayBuffer());
        expect(bytes.length).toBe(a.size);
        expect(sha256(bytes)).toBe(a.sha256);
        // a client that already has the bytes still gets a 304, not a redirect
        expect((await request(r.app).get(a.url).set(bearer(token)).set('If-None-Match', `"${a.sha256}"`).redirects(0)).status).toBe(304);
      }
    });
  });

  describe('rate limit', () => {
    let r: Awaited<ReturnType<typeof testApp>>;
    beforeAll(async () => {
      r = await testApp({ label: 'api-v1-limited', env: { DATABASE_URL: t.databaseUrl, S3_BUCKET: bucket, API_V1_RATE_LIMIT: '3', API_V1_RATE_WINDOW_SECONDS: '120' } });
    });
    afterAll(async () => r?.close());

    it('the fourth request in the window is a 429 problem with Retry-After; another token is counted apart', async () => {
      for (let i = 0; i < 3; i++) expect((await request(r.app).get('/api/v1/whoami').set(bearer(token))).status).toBe(200);
      const res = await request(r.app).get(v1('/packs')).set(bearer(token));
      expect(res.status).toBe(429);
      expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
      expect(res.body).toMatchObject({ status: 429, code: 'rate_limited', title: 'Too many requests', type: 'http://127.0.0.1:3000/api-reference#problem-rate_limited' });
      const retryAfter = Number(res.headers['retry-after']);
      expect(Number.isInteger(retryAfter)).toBe(true);
      expect(retryAfter).toBeGreaterThan(0);
      expect(retryAfter).toBeLessThanOrEqual(120);
      expect(res.headers.ratelimit).toMatch(/r=0/);
      // per token: the limited token has its own allowance; a person has theirs
      expect((await request(r.app).get('/api/v1/whoami').set(bearer(limitedToken))).status).toBe(200);
      expect((await request(r.app).get('/api/v1/whoami').set('Cookie', viewer)).status).toBe(200);
      // the older /api routes are not counted
      expect((await request(r.app).get('/api/health')).status).toBe(200);
    });
  });
});
