/**
 * The build-server API's hot reads stay cheap by design, and manifests describe what a version was
 * baked with. Over the real app, real PostgreSQL and the S3 fake:
 *   - every SQL statement the app sends during one request is counted through Sequelize's logging hook
 *     (Sequelize v6 `options.logging`, called once per statement) and node-postgres pool queries
 *     (ctx.pgPool, the session store) through a wrapper; the bounds are the design's figures
 *     (docs/benchmarks.md "API"), not timings. Statements of the rate limiter's store (a table named
 *     rate_limit…) are left out: that store is a separate part and counted on its own.
 *   - a version proposed (baked) then followed by an edit of a target profile's tolerance: its manifest
 *     still shows the baked tolerance; a version with no bake row shows the profile as it is now.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { randomBytes } from 'node:crypto';
import { testApp } from '../support/app';
import { createPerson, signIn, teamId, uniqueEmail } from '../support/accounts';
import { createToken } from '../../server/tokens/tokens.service';
import { proposeVersion, review } from '../../server/versions/versions.service';
import { release } from '../../server/channels/channels.service';
import { getPack } from '../../server/packs/packs.service';
import { listCurves } from '../../server/packs/packs.repository';
import { listProfiles } from '../../server/profiles/profiles.repository';
import { replaceProfile } from '../../server/profiles/profiles.service';
import { buildVersion } from '../../server/versions/build-artifacts';
import { insertVersion } from '../../server/versions/versions.repository';
import { putContentAddressed } from '../../server/storage/content-store';
import type { ManifestDto } from '../../shared/schemas/api-v1';

const PASSWORD = 'api v1 queries password 1';
const someone = { kind: 'anonymous' } as const;

describe('API v1: queries per request, and manifests from the bake snapshot', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  const bucket = `api-v1-q-${randomBytes(4).toString('hex')}`;
  let team = '';
  let token = '';
  let viewer = '';
  let adminId = '';
  let statements: string[] | null = null;

  const v1 = (path: string) => `/api/v1/teams/${team}${path}`;
  const bearer = () => ({ Authorization: `Bearer ${token}` });

  /** The SQL statements sent while `fn` runs, rate-limit store statements left out. */
  async function sqlOf(fn: () => Promise<unknown>): Promise<string[]> {
    statements = [];
    try {
      await fn();
      const counted = statements.filter((s) => !/rate_limit/i.test(s));
      if (process.env.SHOW_SQL) console.log(counted.length, counted.map((s) => s.slice(0, 90)));
      return counted;
    } finally {
      statements = null;
    }
  }

  beforeAll(async () => {
    t = await testApp({ label: 'api-v1-queries', seed: true, env: { S3_BUCKET: bucket } });
    (t.ctx.sequelize as unknown as { options: { logging: (sql: string) => void } }).options.logging = (sql: string) => {
      statements?.push(sql);
    };
    const pool = t.ctx.pgPool as unknown as { query: (...args: unknown[]) => unknown };
    const poolQuery = pool.query.bind(pool);
    pool.query = (...args: unknown[]) => {
      statements?.push(`pool: ${typeof args[0] === 'string' ? args[0] : JSON.stringify(args[0])}`);
      return poolQuery(...args);
    };
    team = await teamId('ui-motion');
    adminId = await createPerson({ email: uniqueEmail('q-admin'), password: PASSWORD, teams: { 'ui-motion': 'admin' } });
    const viewerEmail = uniqueEmail('q-viewer');
    await createPerson({ email: viewerEmail, password: PASSWORD, teams: { 'ui-motion': 'viewer' } });
    viewer = await signIn(t.app, viewerEmail, PASSWORD);
    token = (await createToken(team, { name: 'build farm' }, adminId)).secret;
    const storage = { s3: t.ctx.s3, bucket };
    // v1 through the proposal path (snapshot + bake row), approved and released
    await proposeVersion(storage, someone, team, 'menu-transitions', 'Baked.', adminId);
    await review(someone, team, 'menu-transitions', 1, adminId, { decision: 'approve', comment: '' });
    await release(someone, team, 'menu-transitions', 'shipping', 1, adminId);
    // the token's first use records last_used_at (then at most once a minute): done before counting
    expect((await request(t.app).get('/api/v1/whoami').set(bearer())).status).toBe(200);
  }, 120_000);
  afterAll(async () => t?.close());

  describe('queries per request (design bounds)', () => {
    const artifact = () => v1('/packs/menu-transitions/versions/1/artifacts/handheld/binary');

    it('an artifact download by token, first read of its version: 2 statements (token, one joined version read); a 304 after it: 1 (the token)', async () => {
      let etag = '';
      const cold = await sqlOf(async () => {
        const res = await request(t.app).get(artifact()).set(bearer()).buffer(true);
        expect(res.status).toBe(200);
        etag = res.headers.etag as string;
      });
      expect(cold.length, cold.join('\n')).toBeLessThanOrEqual(2);
      expect(cold.some((s) => /service_tokens/.test(s))).toBe(true);
      const revalidate = await sqlOf(async () => {
        const res = await request(t.app).get(artifact()).set({ ...bearer(), 'If-None-Match': etag });
        expect(res.status).toBe(304);
        expect(res.headers.etag).toBe(etag);
      });
      expect(revalidate.length, revalidate.join('\n')).toBeLessThanOrEqual(1);
      // the token is still checked on every request (a revoked token must stop working at once)
      expect(revalidate.some((s) => /service_tokens/.test(s))).toBe(true);
      // no last-used write on every request
      expect(revalidate.some((s) => /UPDATE\s+"?service_tokens/i.test(s))).toBe(false);
    });

    it('a channel read by token: 2 statements, the pointer read from the database each time, no history, reviews or people', async () => {
      for (let i = 0; i < 2; i++) {
        const sql = await sqlOf(async () => {
          const res = await request(t.app).get(v1('/packs/menu-transitions/channels/shipping')).set(bearer());
          expect(res.status).toBe(200);
          expect(res.body).toMatchObject({ channel: 'shipping', version: 1, manifest: { state: 'approved' } });
        });
        expect(sql.length, sql.join('\n')).toBeLessThanOrEqual(2);
        expect(sql.some((s) => /FROM packs p JOIN channels c/.test(s))).toBe(true);
        expect(sql.some((s) => /channel_moves|version_reviews|"users"|target_profiles/.test(s)), sql.join('\n')).toBe(false);
      }
    });

    it('a version manifest by token: 2 statements', async () => {
      const sql = await sqlOf(async () => {
        expect((await request(t.app).get(v1('/packs/menu-transitions/versions/1')).set(bearer())).status).toBe(200);
      });
      expect(sql.length, sql.join('\n')).toBeLessThanOrEqual(2);
    });

    it('a signed-in person’s artifact 304 adds only the session and membership checks: at most 3 statements', async () => {
      const etag = (await request(t.app).get(artifact()).set(bearer()).buffer(true)).headers.etag as string;
      const sql = await sqlOf(async () => {
        expect((await request(t.app).get(artifact()).set({ Cookie: viewer, 'If-None-Match': etag })).status).toBe(304);
      });
      expect(sql.length, sql.join('\n')).toBeLessThanOrEqual(3);
    });

    it('a burst of concurrent first requests by a new token writes its last use once', async () => {
      const fresh = (await createToken(team, { name: 'burst' }, adminId)).secret;
      const sql = await sqlOf(() =>
        Promise.all(Array.from({ length: 6 }, async () => {
          expect((await request(t.app).get(artifact()).set({ Authorization: `Bearer ${fresh}` }).buffer(true)).status).toBe(200);
        })),
      );
      expect(sql.filter((s) => /UPDATE\s+"?service_tokens/i.test(s)).length, sql.join('\n')).toBe(1);
      const listed = await request(t.app).get('/api/v1/whoami').set({ Authorization: `Bearer ${fresh}` });
      expect(listed.status).toBe(200);
    });

    it('a channel move is seen at once (the pointer is never cached)', async () => {
      const storage = { s3: t.ctx.s3, bucket };
      await proposeVersion(storage, someone, team, 'menu-transitions', 'Second.', adminId);
      await review(someone, team, 'menu-transitions', 2, adminId, { decision: 'approve', comment: '' });
      await release(someone, team, 'menu-transitions', 'shipping', 2, adminId);
      expect((await request(t.app).get(v1('/packs/menu-transitions/channels/shipping')).set(bearer())).body.version).toBe(2);
      await release(someone, team, 'menu-transitions', 'shipping', 1, adminId);
      expect((await request(t.app).get(v1('/packs/menu-transitions/channels/shipping')).set(bearer())).body.version).toBe(1);
    });
  });

  describe('manifest profiles', () => {
    const handheldOf = (m: ManifestDto) => m.targets.find((x) => x.name === 'Handheld')!;

    it('a baked version keeps the tolerance it was baked with after the profile is edited; a version with no bake row shows the profile as it is now', async () => {
      const before = (await request(t.app).get(v1('/packs/menu-transitions/versions/1')).set(bearer())).body.manifest as ManifestDto;
      const baked = handheldOf(before).tolerance!;
      expect(baked.value).toBeGreaterThan(0);

      const stored = (await listProfiles(team)).find((s) => s.profile.name === 'Handheld')!;
      const edited = baked.value * 4;
      await replaceProfile(team, stored.id, { ...stored.profile, tolerance: { ...stored.profile.tolerance, value: edited } }, stored.version);
      expect((await listProfiles(team)).find((s) => s.profile.name === 'Handheld')!.profile.tolerance.value).toBe(edited);

      const after = await request(t.app).get(v1('/packs/menu-transitions/versions/1')).set(bearer());
      expect(handheldOf(after.body.manifest).tolerance).toEqual(baked);
      expect(after.body.manifest).toEqual(before);
      const viaChannel = await request(t.app).get(v1('/packs/menu-transitions/channels/shipping')).set(bearer());
      expect(handheldOf(viaChannel.body.manifest).tolerance).toEqual(baked);

      // a version inserted without a bake (as before background bakes existed): the current profile
      const storage = { s3: t.ctx.s3, bucket };
      const pack = await getPack(someone, team, 'menu-transitions');
      const curves = await listCurves(pack.id);
      const built = buildVersion(pack, curves.map((c) => c.document), (await listProfiles(team)).map((x) => x.profile));
      const artifacts = [];
      for (const o of built.objects) {
        const s = await putContentAddressed(storage.s3, storage.bucket, o.bytes, o.mediaType);
        artifacts.push({ profileName: o.profileName, format: o.format, fileName: o.fileName, mediaType: o.mediaType, key: s.key, sha256: s.sha256, size: s.size });
      }
      const old = await insertVersion({ packId: pack.id, changelog: 'No bake row.', proposedBy: adminId, curveCount: curves.length, source: { key: artifacts[0]!.key, sha256: artifacts[0]!.sha256, size: artifacts[0]!.size }, bakeSummary: built.summary, artifacts });
      const legacy = await request(t.app).get(v1(`/packs/menu-transitions/versions/${old.number}`)).set(bearer());
      expect(legacy.status).toBe(200);
      expect(handheldOf(legacy.body.manifest).tolerance!.value).toBe(edited);
    });
  });
});
