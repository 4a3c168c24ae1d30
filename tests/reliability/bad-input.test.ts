/**
 * Bad input, generated with fast-check 4.11.0 (fixed seed, so a failure replays): every write route
 * (POST/PUT/PATCH/DELETE) the API router has — found by walking the router stack, as the
 * authorization matrix does — gets generated bodies and query strings from a signed-in admin of the
 * right team, so validation, not authorization, is what answers. Each answer must be
 *   - below 500, JSON, `{ error: { code, message } }` with a message that says what is wrong, and for a
 *     400 on an object body a `fields` map naming the field;
 *   - with nothing stored: the row count of every table (sessions, rate-limit and log tables aside) is
 *     the same after the route's run as before.
 * Generated bodies that the route's own schema accepts are filtered out (they are good input).
 * Routes with no body get generated path parameters and query strings instead.
 * Curve documents: a valid document with one field mutated → 400 naming `document.<path>`.
 * Also: malformed JSON → 400 JSON; over the body limit → 413 JSON; malformed bearer tokens → 401;
 * CSS easing strings that do not parse → a clear error from the shared parser (used by the CLI and the
 * editor's import; the server has no CSS route).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import fc from 'fast-check';
import { spawnSync } from 'node:child_process';
import { randomBytes, randomUUID } from 'node:crypto';
import type { z } from 'zod';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail } from '../support/accounts';
import { listRoutes } from '../support/route-walk';
import { tableCounts } from './support/table-counts';
import { anyJson, deepJson, getAt as getAtPath, hugeStrings, junkParam, junkQuery, notJson, oneFieldWrong, percentEncode, pollutedJson, AWKWARD_STRINGS, NAN_LIKE } from './support/bad-values';
import { passwordChangeSchema, profileSchema, resetCompleteSchema, resetRequestSchema, signInSchema, acceptInvitationSchema, inviteSchema, memberRoleSchema, createTokenSchema } from '../../shared/schemas/accounts';
import { curveCreateSchema, curveReorderSchema, curveReplaceSchema, curveTransferSchema, packCreateSchema, packUpdateSchema } from '../../shared/schemas/packs';
import { proposeVersionSchema, reviewSchema } from '../../shared/schemas/versions';
import { releaseSchema } from '../../shared/schemas/channels';
import { profileReplaceSchema } from '../../shared/schemas/profiles';
import { parseProfile } from '../../shared/bake/profile';
import { parseCurveDocument } from '../../shared/curve/schema';
import { parseCssEasing, evaluateCssEasing } from '../../shared/convert';
import { createToken } from '../../server/tokens/tokens.service';
import { insertInvitation } from '../../server/invitations/invitations.repository';
import { createProfile } from '../../server/profiles/profiles.service';
import { createCurve, createPack } from '../../server/packs/packs.service';
import { proposeVersion } from '../../server/versions/versions.service';
import { DEMO_PACKS } from '../../server/seed/demo-packs';
import { createWebhookSchema, updateWebhookSchema } from '../../shared/schemas/webhooks';
import { commentSchema } from '../../shared/schemas/comments';
import { markReadSchema } from '../../shared/schemas/notifications';
import { PROBLEM_MEDIA_TYPE } from '../../shared/schemas/api-v1';
import { createWebhook } from '../../server/webhooks/webhooks.service';
import { almostCurveFile, badTolerance, brokenCsvFile, brokenGlbFile, randomBytesFile, type BadFile } from './support/upload-files';

const SEED = 20_261_202;
const RUNS = 25;
const PASSWORD = 'bad input password 1';

type Body = Record<string, unknown>;
interface Spec {
  /** A body the route accepts (mutated into bad ones); absent for routes without a body. */
  valid?: () => Body;
  /** Whether the route's own validation would accept `body` (such bodies are good input, not tested here). */
  accepts?: (body: unknown) => boolean;
}

const ok = (schema: z.ZodType) => (b: unknown) => schema.safeParse(b).success;
const doc = (name = 'bad-input-curve') => ({ ...structuredClone(DEMO_PACKS[0]!.curves[0]!), name });
const webhook = () => ({ url: 'https://builds.corvid-lantern.test/hooks/tangentry', events: ['version.approved', 'channel.moved'], description: 'fuzz hook' });
const comment = () => ({ body: 'The overshoot reads late on handheld.', curve: 'bad-input-curve', time: 0.25 });
const profile = () => ({ name: `Fuzz ${randomBytes(3).toString('hex')}`, tolerance: { mode: 'absolute', value: 5e-4 }, kernel: 'hermite', layout: 'adaptive', encoding: 'f32' });

interface Fixture {
  team: string;
  pack: string;
  curveId: string;
  revision: number;
  otherPack: string;
  profileId: string;
  memberId: string;
  invitationId: string;
  tokenId: string;
  version: number;
  webhookId: string;
  /** A service token's secret for /api/v1. */
  bearer: string;
}

/** Known write routes: a valid body and the route's acceptance rule. Unknown routes get the generic run. */
const SPECS: Record<string, Spec> = {
  'POST /api/auth/sign-in': { valid: () => ({ email: 'nobody@corvid-lantern.test', password: 'wrong' }), accepts: ok(signInSchema) },
  'POST /api/auth/sign-out': {},
  'POST /api/auth/sign-out-everywhere': {},
  'PATCH /api/auth/me': { valid: () => ({ name: 'Fuzz Person' }), accepts: ok(profileSchema) },
  'POST /api/auth/password': { valid: () => ({ currentPassword: 'not it', newPassword: 'another long one' }), accepts: ok(passwordChangeSchema) },
  'POST /api/auth/password-reset': { valid: () => ({ email: 'nobody@corvid-lantern.test' }), accepts: ok(resetRequestSchema) },
  'POST /api/auth/password-reset/complete': { valid: () => ({ token: 'rst_not_a_real_token', password: 'a long new password' }), accepts: ok(resetCompleteSchema) },
  'POST /api/invitations/accept': { valid: () => ({ token: 'inv_not_a_real_token', name: 'X', password: 'a long new password' }), accepts: ok(acceptInvitationSchema) },
  'PATCH /api/teams/:teamId/members/:userId': { valid: () => ({ role: 'animator' }), accepts: ok(memberRoleSchema) },
  'DELETE /api/teams/:teamId/members/:userId': {},
  'POST /api/teams/:teamId/invitations': { valid: () => ({ email: uniqueEmail('fuzz-invite'), role: 'viewer' }), accepts: ok(inviteSchema) },
  'DELETE /api/teams/:teamId/invitations/:invitationId': {},
  'POST /api/teams/:teamId/tokens': { valid: () => ({ name: 'fuzz token', packSlugs: ['menu-transitions'] }), accepts: ok(createTokenSchema) },
  'DELETE /api/teams/:teamId/tokens/:tokenId': {},
  'POST /api/teams/:teamId/profiles': { valid: profile, accepts: (b) => parseProfile(b).ok },
  'PUT /api/teams/:teamId/profiles/:profileId': {
    valid: () => ({ profile: profile(), version: 1 }),
    accepts: (b) => profileReplaceSchema.safeParse(b).success && parseProfile((b as Body).profile).ok,
  },
  'DELETE /api/teams/:teamId/profiles/:profileId': {},
  'POST /api/teams/:teamId/packs': { valid: () => ({ name: 'Fuzz pack', description: 'd', frameRate: 60, tags: ['a'] }), accepts: ok(packCreateSchema) },
  'PATCH /api/teams/:teamId/packs/:pack': { valid: () => ({ name: 'Fuzz renamed', archived: false, tags: ['b'] }), accepts: ok(packUpdateSchema) },
  'POST /api/teams/:teamId/packs/:pack/curves': { valid: () => ({ document: doc('fuzz-new') }), accepts: (b) => curveCreateSchema.safeParse(b).success && parseCurveDocument((b as Body).document).ok },
  'POST /api/teams/:teamId/packs/:pack/reorder': { valid: () => ({ curveIds: [randomUUID()] }), accepts: ok(curveReorderSchema) },
  'PUT /api/teams/:teamId/packs/:pack/curves/:curveId': {
    valid: () => ({ document: doc(), revision: 1 }),
    accepts: (b) => curveReplaceSchema.safeParse(b).success && parseCurveDocument((b as Body).document).ok,
  },
  'DELETE /api/teams/:teamId/packs/:pack/curves/:curveId': {},
  'POST /api/teams/:teamId/packs/:pack/curves/:curveId/move': { valid: () => ({ toPack: 'fuzz-other' }), accepts: ok(curveTransferSchema) },
  'POST /api/teams/:teamId/packs/:pack/curves/:curveId/copy': { valid: () => ({ toPack: 'fuzz-other', name: 'copied' }), accepts: ok(curveTransferSchema) },
  'POST /api/teams/:teamId/packs/:pack/versions': { valid: () => ({ changelog: 'fuzz' }), accepts: ok(proposeVersionSchema) },
  'POST /api/teams/:teamId/packs/:pack/versions/:number/reviews': { valid: () => ({ decision: 'request-changes', comment: 'c' }), accepts: ok(reviewSchema) },
  'PUT /api/teams/:teamId/packs/:pack/channels/:channel': { valid: () => ({ version: 1 }), accepts: ok(releaseSchema) },
  'POST /api/teams/:teamId/webhooks': { valid: webhook, accepts: ok(createWebhookSchema) },
  'PATCH /api/teams/:teamId/webhooks/:webhookId': { valid: () => ({ ...webhook(), active: true }), accepts: ok(updateWebhookSchema) },
  'DELETE /api/teams/:teamId/webhooks/:webhookId': {},
  'POST /api/teams/:teamId/webhooks/:webhookId/rotate-secret': {},
  'POST /api/teams/:teamId/webhooks/:webhookId/ping': {},
  'POST /api/teams/:teamId/webhooks/:webhookId/deliveries/:deliveryId/redeliver': {},
  'POST /api/teams/:teamId/packs/:pack/versions/:number/comments': { valid: comment, accepts: ok(commentSchema) },
  'POST /api/teams/:teamId/packs/:pack/bakes/:bakeId/retry': {},
  'POST /api/me/notifications/read': { valid: () => ({ ids: [randomUUID(), randomUUID()] }), accepts: ok(markReadSchema) },
};

/** Near-valid bodies on the newer routes: a valid body, and the field(s) a 400 may name when `path` is wrong. */
const NEAR_VALID: { route: string; valid: () => Body; accepts: (b: unknown) => boolean; names: (path: (string | number)[]) => string[] }[] = [
  { route: 'POST /api/teams/:teamId/webhooks', valid: webhook, accepts: ok(createWebhookSchema), names: (p) => [String(p[0])] },
  { route: 'PATCH /api/teams/:teamId/webhooks/:webhookId', valid: () => ({ ...webhook(), active: true }), accepts: ok(updateWebhookSchema), names: (p) => [String(p[0])] },
  // curve set to nothing leaves a time without a curve: the time is what is wrong then
  { route: 'POST /api/teams/:teamId/packs/:pack/versions/:number/comments', valid: comment, accepts: ok(commentSchema), names: (p) => (p[0] === 'curve' ? ['curve', 'time'] : [String(p[0])]) },
  { route: 'POST /api/me/notifications/read', valid: () => ({ ids: [randomUUID(), randomUUID()] }), accepts: ok(markReadSchema), names: () => ['ids'] },
  { route: 'POST /api/me/notifications/read', valid: () => ({ all: true }), accepts: ok(markReadSchema), names: () => ['all', 'ids'] },
];

const WRITE = /^(POST|PUT|PATCH|DELETE) /;
/** Routes whose handler ends the caller's session: bodies are not read, so only malformed JSON is sent. */
const ENDS_SESSION = new Set(['POST /api/auth/sign-out', 'POST /api/auth/sign-out-everywhere']);

describe('bad input on every write route', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let cookie = '';
  let fx: Fixture;
  let routes: string[] = [];

  beforeAll(async () => {
    t = await testApp({ label: 'badinput', seed: true, env: { AUTH_RATE_LIMIT: '100000' } });
    const team = await teamId('ui-motion');
    const email = uniqueEmail('fuzz-admin');
    const adminId = await createPerson({ email, password: PASSWORD, teams: { 'ui-motion': 'admin' } });
    cookie = await signIn(t.app, email, PASSWORD);
    const someone = { kind: 'anonymous' } as const;
    const pack = await createPack(team, { name: 'Fuzz target', slug: 'fuzz-target', description: '', frameRate: 60, tags: [] });
    await createPack(team, { name: 'Fuzz other', slug: 'fuzz-other', description: '', frameRate: 60, tags: [] });
    const curve = await createCurve(someone, team, pack.slug, doc());
    const storage = { s3: t.ctx.s3, bucket: t.config.s3.bucket };
    const v = await proposeVersion(storage, someone, team, pack.slug, 'fuzz v1', adminId);
    const prof = await createProfile(team, profile());
    const memberId = await createPerson({ email: uniqueEmail('fuzz-member'), password: PASSWORD, teams: { 'ui-motion': 'viewer' } });
    const inv = await insertInvitation({ id: randomUUID(), teamId: team, email: uniqueEmail('fuzz-inv'), role: 'viewer', tokenHash: randomBytes(32).toString('hex'), invitedBy: adminId, expiresAt: new Date(Date.now() + 86_400_000) });
    const tok = await createToken(team, { name: 'fuzz existing' }, adminId);
    const hook = await createWebhook(t.ctx, team, { url: 'https://builds.corvid-lantern.test/hooks/existing', events: ['channel.moved'], description: '' }, adminId);
    fx = { team, pack: pack.slug, curveId: curve.id, revision: curve.revision, otherPack: 'fuzz-other', profileId: prof.id, memberId, invitationId: inv.id, tokenId: tok.token.id, version: v.number, webhookId: hook.webhook.id, bearer: tok.secret };
    routes = listRoutes(t.app).filter((r) => r.split(' ')[1]!.startsWith('/api/'));
  }, 60_000);
  afterAll(async () => t?.close());

  /** The route's URL with every parameter filled with a real value (unknown parameters: a fresh UUID). */
  function urlOf(route: string, override: Record<string, string> = {}): string {
    const path = route.split(' ')[1]!;
    const real: Record<string, string> = {
      teamId: fx.team, pack: fx.pack, curveId: fx.curveId, profileId: fx.profileId, userId: fx.memberId, invitationId: fx.invitationId,
      tokenId: fx.tokenId, number: String(fx.version), channel: 'shipping', token: 'inv_not_a_real_token', webhookId: fx.webhookId,
    };
    return path.replace(/:(\w+)/g, (_m, name: string) => percentEncode(override[name] ?? real[name] ?? randomUUID()));
  }

  function send(route: string, url: string, raw: string | undefined, headers: Record<string, string> = {}) {
    const method = route.split(' ')[0]!.toLowerCase() as 'post';
    let req = request(t.app)[method](url).set('Origin', ORIGIN).set('Cookie', cookie);
    for (const [k, v] of Object.entries(headers)) req = req.set(k, v);
    if (raw === undefined || raw === '') return req;
    return req.set('Content-Type', 'application/json').send(raw);
  }

  /** The answer to bad input: below 500, JSON, an error with a code and a message; 400s on objects name fields. */
  function expectRefusal(res: request.Response, what: string, sentObject: boolean): void {
    const ctx = `${what} → ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`;
    expect(res.status, ctx).toBeGreaterThanOrEqual(400);
    expect(res.status, ctx).toBeLessThan(500);
    expect(res.headers['content-type'] ?? '', ctx).toMatch(/application\/json/);
    expect(typeof res.body?.error?.code, ctx).toBe('string');
    expect(typeof res.body?.error?.message, ctx).toBe('string');
    expect(res.body.error.message.length, ctx).toBeGreaterThan(3);
    if (res.status === 400 && sentObject && res.body.error.code === 'invalid_request') {
      expect(Object.keys(res.body.error.fields ?? {}).length, `${ctx}: a 400 on an object body names the field`).toBeGreaterThan(0);
    }
  }

  it('the router has write routes, and each one without a spec is reported', () => {
    const writes = routes.filter((r) => WRITE.test(r));
    expect(writes.length).toBeGreaterThan(20);
    const unknown = writes.filter((r) => !SPECS[r]);
    // not a failure: unknown routes still get the generic run below; listed so a spec gets written
    if (unknown.length) console.warn(`bad-input: write routes without a spec (generic bodies only): ${unknown.join(', ')}`);
  });

  it('every write route: generated bodies and query strings are refused with a JSON error and nothing is stored', async () => {
    const writes = routes.filter((r) => WRITE.test(r) && !ENDS_SESSION.has(r));
    for (const route of writes) {
      const spec = SPECS[route] ?? {};
      const accepts = spec.accepts ?? (() => false);
      const before = await tableCounts(t.ctx.sequelize);
      if (spec.valid) {
        const valid = spec.valid();
        const bodies = fc.oneof(
          { weight: 3, arbitrary: anyJson },
          { weight: 4, arbitrary: oneFieldWrong(valid).map((m) => JSON.stringify(m.body)) },
          { weight: 1, arbitrary: hugeStrings(valid) },
          { weight: 1, arbitrary: deepJson },
          { weight: 2, arbitrary: pollutedJson(valid) },
        ).filter((raw) => {
          if (raw === '') return !accepts({});
          try {
            return !accepts(JSON.parse(raw));
          } catch {
            return true;
          }
        });
        await fc.assert(
          fc.asyncProperty(bodies, junkQuery, async (raw, query) => {
            const res = await send(route, `${urlOf(route)}${query ? `?${query}` : ''}`, raw);
            let parsed: unknown;
            try { parsed = raw ? JSON.parse(raw) : undefined; } catch { parsed = undefined; }
            expectRefusal(res, `${route} ${raw.slice(0, 200)}`, !!parsed && typeof parsed === 'object' && !Array.isArray(parsed));
          }),
          { seed: SEED, numRuns: RUNS },
        );
      } else if (SPECS[route]) {
        // no body: generated path parameters (each parameter in turn) and query strings
        const params = [...route.matchAll(/:(\w+)/g)].map((m) => m[1]!).filter((p) => p !== 'teamId');
        if (params.length) {
          await fc.assert(
            fc.asyncProperty(fc.constantFrom(...params), junkParam, junkQuery, async (param, value, query) => {
              const res = await send(route, `${urlOf(route, { [param]: value })}${query ? `?${query}` : ''}`, undefined);
              expectRefusal(res, `${route} ${param}=${value.slice(0, 60)}`, false);
            }),
            { seed: SEED, numRuns: RUNS },
          );
        }
      } else {
        // a route this test has no spec for yet: anything at all, with generated query strings
        await fc.assert(
          fc.asyncProperty(fc.oneof(anyJson, deepJson), junkQuery, async (raw, query) => {
            const res = await send(route, `${urlOf(route)}${query ? `?${query}` : ''}`, raw);
            expect(res.status, `${route} ${raw.slice(0, 200)} → ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`).toBeLessThan(500);
          }),
          { seed: SEED, numRuns: RUNS },
        );
      }
      expect(await tableCounts(t.ctx.sequelize), `${route}: row counts after the bad input`).toEqual(before);
    }
    // prototype pollution never reached the process
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    expect(({} as Record<string, unknown>).isAdmin).toBeUndefined();
  }, 240_000);

  it('every route with parameters: generated path parameters never cause a 5xx (reads included)', async () => {
    const withParams = routes.filter((r) => r.includes('/:') && !ENDS_SESSION.has(r));
    for (const route of withParams) {
      const params = [...route.matchAll(/:(\w+)/g)].map((m) => m[1]!);
      await fc.assert(
        fc.asyncProperty(fc.constantFrom(...params), junkParam, junkQuery, async (param, value, query) => {
          const res = await send(route, `${urlOf(route, { [param]: value })}${query ? `?${query}` : ''}`, undefined);
          expect(res.status, `${route} ${param}=${JSON.stringify(value.slice(0, 60))} → ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`).toBeLessThan(500);
          // /api/v1 answers RFC 9457 problem details ({ type, title, status, detail }); the rest { error: { code, message } }
          if (res.status >= 400) expect(typeof (res.body?.error?.message ?? res.body?.detail ?? res.body?.title), `${route} ${param}=${JSON.stringify(value.slice(0, 60))} → ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`).toBe('string');
        }),
        { seed: SEED, numRuns: 10 },
      );
    }
  }, 240_000);

  it('GET routes: generated query strings never cause a 5xx', async () => {
    const reads = routes.filter((r) => r.startsWith('GET '));
    for (const route of reads) {
      await fc.assert(
        fc.asyncProperty(junkQuery, async (query) => {
          const res = await request(t.app).get(`${urlOf(route)}?${query}`).set('Cookie', cookie);
          expect(res.status, `${route}?${query.slice(0, 200)} → ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`).toBeLessThan(500);
        }),
        { seed: SEED, numRuns: 10 },
      );
    }
  }, 120_000);

  it('curve documents: a valid document with one field mutated → 400 naming document.<path>, nothing stored', async () => {
    const before = await tableCounts(t.ctx.sequelize);
    const valid = doc();
    const mutated = oneFieldWrong(valid).filter((m) => !parseCurveDocument(m.body).ok);
    // an unknown field anywhere is refused too (strict objects)
    const extraField = fc.constantFrom<(string | number)[]>([], ['units'], ['keys', 0], ['segments', 0]).map((path) => {
      const body = structuredClone(valid) as Record<string, unknown>;
      const target = path.reduce<Record<string, unknown>>((o, k) => o[k] as Record<string, unknown>, body);
      target.colour = 'not a field';
      return { path: [...path, 'colour'], body };
    });
    await fc.assert(
      fc.asyncProperty(fc.oneof(mutated, extraField), fc.boolean(), async ({ path, body }, create) => {
        const route = create ? 'POST /api/teams/:teamId/packs/:pack/curves' : 'PUT /api/teams/:teamId/packs/:pack/curves/:curveId';
        const payload = create ? { document: body } : { document: body, revision: fx.revision };
        const res = await send(route, urlOf(route), JSON.stringify(payload));
        const ctx = `${path.join('.')} → ${res.status} ${JSON.stringify(res.body).slice(0, 400)}`;
        expect(res.status, ctx).toBe(400);
        const fields = Object.keys(res.body.error.fields ?? {});
        expect(fields.length, ctx).toBeGreaterThan(0);
        expect(fields.every((f) => f === 'document' || f.startsWith('document.')), ctx).toBe(true);
        // the mutated field (or, for an unknown key, the object that holds it) is named
        const named = (p: (string | number)[]) => `document${p.map((k) => (typeof k === 'number' ? `[${k}]` : `.${k}`)).join('')}`;
        const candidates = [named(path), named(path.slice(0, -1))];
        expect(fields.some((f) => candidates.some((c) => f === c || f.startsWith(`${c}.`) || f.startsWith(`${c}[`)) || (fields.includes('document.segments') && path[0] === 'keys')), ctx).toBe(true);
        expect(res.body.error.message, ctx).toMatch(/^document/);
      }),
      { seed: SEED, numRuns: 60 },
    );
    expect(await tableCounts(t.ctx.sequelize)).toEqual(before);
    const stored = await request(t.app).get(urlOf('GET /api/teams/:teamId/packs/:pack/curves/:curveId')).set('Cookie', cookie);
    expect(stored.body.curve.revision).toBe(fx.revision);
    expect(stored.body.curve.document).toEqual(valid);
  }, 120_000);

  it('webhooks, comments, notices read: a valid body with one field wrong → 400 naming that field, nothing stored', async () => {
    const before = await tableCounts(t.ctx.sequelize);
    for (const { route, valid, accepts, names } of NEAR_VALID) {
      const body = valid();
      // besides one wrong value: an unknown key is ignored or refused, never stored; both ids and all is refused naming ids
      const cases = oneFieldWrong(body).filter((m) => !accepts(m.body));
      await fc.assert(
        fc.asyncProperty(cases, async ({ path, body: bad }) => {
          const res = await send(route, urlOf(route), JSON.stringify(bad));
          const ctx = `${route} ${path.join('.')}=${JSON.stringify(getAtPath(bad, path))?.slice(0, 80)} → ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`;
          expect(res.status, ctx).toBe(400);
          expect(res.headers['content-type'] ?? '', ctx).toMatch(/application\/json/);
          expect(res.body.error.code, ctx).toBe('invalid_request');
          const fields = Object.keys(res.body.error.fields ?? {});
          const wanted = names(path);
          expect(fields.some((f) => wanted.some((w) => f === w || f.startsWith(`${w}.`) || f.startsWith(`${w}[`))), `${ctx}: names ${wanted.join(' or ')}`).toBe(true);
          expect(res.body.error.message.length, ctx).toBeGreaterThan(3);
        }),
        { seed: SEED, numRuns: RUNS },
      );
    }
    // the one-of rule of POST /api/me/notifications/read: neither, or both, names ids (shared/schemas/notifications.ts)
    for (const bad of [{}, { ids: [randomUUID()], all: true }, { ids: [] }, { all: false }]) {
      const res = await send('POST /api/me/notifications/read', '/api/me/notifications/read', JSON.stringify(bad));
      expect(res.status, JSON.stringify(bad)).toBe(400);
      expect(Object.keys(res.body.error.fields ?? {}).some((f) => f === 'ids' || f === 'all'), JSON.stringify(res.body)).toBe(true);
    }
    // a comment's time without a curve, and a time that is not finite (JSON has no NaN: 1e999 parses as Infinity)
    const commentUrl = urlOf('POST /api/teams/:teamId/packs/:pack/versions/:number/comments');
    for (const [raw, field] of [['{"body":"x","time":0.5}', 'time'], ['{"body":"x","curve":"bad-input-curve","time":1e999}', 'time'], ['{"body":"   "}', 'body'], [JSON.stringify({ body: 'x'.repeat(5001) }), 'body'], [JSON.stringify({ body: 'x', curve: 'c'.repeat(201) }), 'curve']] as const) {
      const res = await send('POST /api/teams/:teamId/packs/:pack/versions/:number/comments', commentUrl, raw);
      expect(res.status, raw.slice(0, 80)).toBe(400);
      expect(Object.keys(res.body.error.fields ?? {}), raw.slice(0, 80)).toContain(field);
    }
    // a webhook URL that is not an http(s) address, or carries credentials; an event that does not exist
    const hookUrl = urlOf('POST /api/teams/:teamId/webhooks');
    for (const [body, field] of [
      [{ ...webhook(), url: 'ftp://builds.corvid-lantern.test/x' }, 'url'], [{ ...webhook(), url: 'https://user:pw@builds.corvid-lantern.test/' }, 'url'],
      [{ ...webhook(), url: 'not a url' }, 'url'], [{ ...webhook(), events: [] }, 'events'], [{ ...webhook(), events: ['curve.saved'] }, 'events[0]'], [{ ...webhook(), events: ['ping'] }, 'events[0]'],
    ] as const) {
      const res = await send('POST /api/teams/:teamId/webhooks', hookUrl, JSON.stringify(body));
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(Object.keys(res.body.error.fields ?? {}), JSON.stringify(res.body)).toContain(field);
    }
    expect(await tableCounts(t.ctx.sequelize)).toEqual(before);
  }, 120_000);

  it('bulk uploads: generated bad files get per-file errors (200) or a 400/413 naming the file/field, never a 5xx, no curve from a failed file', async () => {
    const slug = 'fuzz-uploads';
    await createPack(fx.team, { name: 'Fuzz uploads', slug, description: '', frameRate: 60, tags: [] });
    const uploadUrl = `/api/teams/${fx.team}/packs/${slug}/uploads`;
    const curvesUrl = `/api/teams/${fx.team}/packs/${slug}/curves`;
    const stored = async (): Promise<string[]> => {
      const res = await request(t.app).get(curvesUrl).set('Cookie', cookie);
      expect(res.status).toBe(200);
      return ((res.body.curves ?? []) as { name?: string; document?: { name: string } }[]).map((c) => c.name ?? c.document!.name).sort();
    };
    const file = fc.oneof(randomBytesFile, brokenCsvFile, almostCurveFile(doc('almost')), brokenGlbFile);
    const tolerance = fc.option(fc.oneof({ weight: 1, arbitrary: badTolerance }, { weight: 2, arbitrary: fc.constantFrom('0.001', '1e-4', ' 0.5 ', '') }), { nil: undefined });
    const attach = (files: BadFile[], tol: string | undefined) => {
      let req = request(t.app).post(uploadUrl).set('Origin', ORIGIN).set('Cookie', cookie);
      if (tol !== undefined) req = req.field('tolerance', tol);
      for (const f of files) req = req.attach('files', f.bytes, f.name);
      return req;
    };
    await fc.assert(
      fc.asyncProperty(fc.array(file, { minLength: 1, maxLength: 4 }), tolerance, async (files, tol) => {
        const before = await stored();
        const countsBefore = await tableCounts(t.ctx.sequelize);
        const res = await attach(files, tol);
        const ctx = `${files.map((f) => `${f.kind} ${f.name}`).join(' | ')} tolerance=${JSON.stringify(tol)} → ${res.status} ${JSON.stringify(res.body).slice(0, 400)}`;
        expect(res.status, ctx).toBeLessThan(500);
        expect(res.headers['content-type'] ?? '', ctx).toMatch(/application\/json/);
        const badTol = tol !== undefined && tol.trim() !== '' && !(Number(tol.trim()) > 0 && Number.isFinite(Number(tol.trim())));
        if (badTol) {
          expect(res.status, ctx).toBe(400);
          expect(Object.keys(res.body.error.fields ?? {}), ctx).toContain('tolerance');
          expect(await stored(), ctx).toEqual(before);
          expect(await tableCounts(t.ctx.sequelize), ctx).toEqual(countsBefore);
          return;
        }
        if (res.status !== 200) {
          expect([400, 413], ctx).toContain(res.status);
          expect(Object.keys(res.body.error.fields ?? {}).length, ctx).toBeGreaterThan(0);
          expect(await stored(), ctx).toEqual(before);
          return;
        }
        const results = res.body.results as { file: string; ok: boolean; error?: string; field?: string; curves?: { name: string }[] }[];
        expect(results.length, ctx).toBe(files.length);
        results.forEach((r, i) => {
          expect(r.file, ctx).toBe(files[i]!.name);
          if (!r.ok) {
            expect(typeof r.error, ctx).toBe('string');
            expect(r.error!.length, ctx).toBeGreaterThan(3);
            expect(typeof r.field, ctx).toBe('string');
          }
        });
        // only the files answered ok added curves (a generated file may happen to be good input)
        const added = results.filter((r) => r.ok).flatMap((r) => r.curves!.map((c) => c.name));
        const after = await stored();
        expect(after.length - before.length, ctx).toBe(added.length);
        expect(after.filter((n) => !before.includes(n)).sort(), ctx).toEqual([...added].sort());
        const refused = files.filter((f, i) => !results[i]!.ok && /\.(csv|json|gltf|glb)$/i.test(f.name));
        if (refused.length && added.length === 0) expect(await tableCounts(t.ctx.sequelize), ctx).toEqual(countsBefore);
      }),
      { seed: SEED, numRuns: 30 },
    );
    // one file over the size limit among good ones: 413 naming the field and the file, nothing stored
    const before = await stored();
    const big = await attach([{ kind: 'big', name: 'tiny.csv', bytes: Buffer.from('0,0\n1,1\n') }, { kind: 'big', name: 'huge.csv', bytes: Buffer.alloc(2 * 1024 * 1024 + 1, 0x30) }], undefined);
    expect(big.status).toBe(413);
    expect(Object.keys(big.body.error.fields ?? {})).toContain('files');
    expect(big.body.error.message).toContain('huge.csv');
    expect(await stored()).toEqual(before);
    // files in the wrong form field, and no files at all: 400 naming the field
    const wrongField = await request(t.app).post(uploadUrl).set('Origin', ORIGIN).set('Cookie', cookie).attach('file', Buffer.from('0,0\n1,1\n'), 'a.csv');
    expect(wrongField.status).toBe(400);
    expect(Object.keys(wrongField.body.error.fields ?? {}).length).toBeGreaterThan(0);
    const none = await request(t.app).post(uploadUrl).set('Origin', ORIGIN).set('Cookie', cookie).field('tolerance', '0.01');
    expect(none.status).toBe(400);
    expect(Object.keys(none.body.error.fields ?? {})).toContain('files');
    expect(await stored()).toEqual(before);
  }, 120_000);

  it('activity query strings (type, pack, actor, subject, before, after, limit): never a 5xx; a 400 names the parameter', async () => {
    const KEYS = ['type', 'pack', 'actor', 'subject', 'before', 'after', 'limit'] as const;
    const value = fc.oneof(
      fc.string({ maxLength: 30 }),
      fc.constantFrom(...NAN_LIKE, ...AWKWARD_STRINGS, 'curve.saved', 'fuzz-target', 'x'.repeat(300), 'AAAAAAAAAAAA', 'MjAyNnxub3RhbmlkZW50aWZpZXI', '-5', '0', '101', '25', '1.5', 'pack'),
      fc.base64String({ minLength: 8, maxLength: 80 }).map((b) => b.replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '')),
    );
    const query = fc.array(fc.tuple(fc.constantFrom(...KEYS, 'type[]', 'limit[0]'), value), { minLength: 1, maxLength: 4 });
    await fc.assert(
      fc.asyncProperty(query, async (pairs) => {
        const qs = pairs.map(([k, v]) => `${percentEncode(k)}=${percentEncode(v)}`).join('&');
        const res = await request(t.app).get(`/api/teams/${fx.team}/activity?${qs}`).set('Cookie', cookie);
        const ctx = `?${qs.slice(0, 200)} → ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`;
        expect(res.status, ctx).toBeLessThan(500);
        expect(res.headers['content-type'] ?? '', ctx).toMatch(/application\/json/);
        if (res.status === 400) {
          const fields = Object.keys(res.body.error.fields ?? {});
          expect(fields.some((f) => pairs.some(([k]) => f === k || k.startsWith(`${f}[`)) || f === '(body)'), ctx).toBe(true);
        } else {
          expect(res.status, ctx).toBe(200);
        }
      }),
      { seed: SEED, numRuns: 60 },
    );
  }, 60_000);

  it('/api/v1 path parameters (team, pack, number, channel, target, format): never a 5xx; errors are application/problem+json', async () => {
    const auth = `Bearer ${fx.bearer}`;
    const manifest = await request(t.app).get(`/api/v1/teams/${fx.team}/packs/${fx.pack}/versions/${fx.version}`).set('Authorization', auth);
    expect(manifest.status, JSON.stringify(manifest.body).slice(0, 300)).toBe(200);
    const firstTarget = (manifest.body.manifest?.targets ?? []).find((x: { artifacts: unknown[] }) => x.artifacts.length) as { target: string; artifacts: { format: string }[] } | undefined;
    const real: Record<string, string> = { teamId: fx.team, pack: fx.pack, number: String(fx.version), channel: 'shipping', target: firstTarget?.target ?? 'handheld', format: firstTarget?.artifacts[0]?.format ?? 'json' };
    const v1Routes = routes.filter((r) => r.startsWith('GET /api/v1/') && r.includes('/:'));
    expect(v1Routes.length).toBeGreaterThanOrEqual(4);
    const v1Param = fc.oneof(junkParam, fc.constantFrom('..', '.', '%2e%2e', 'a/b', '-1', '0', '1e2', '0x1', '  1', 'JSON', 'json ', 'handheld.json', '99999999999999999999'));
    for (const route of v1Routes) {
      const params = [...route.matchAll(/:(\w+)/g)].map((m) => m[1]!);
      await fc.assert(
        fc.asyncProperty(fc.constantFrom(...params), v1Param, async (param, junk) => {
          const path = route.split(' ')[1]!.replace(/:(\w+)/g, (_m, name: string) => (name === param ? percentEncode(junk) : percentEncode(real[name] ?? 'x')));
          const res = await request(t.app).get(path).set('Authorization', auth);
          const ctx = `${route} ${param}=${JSON.stringify(junk.slice(0, 60))} → ${res.status} ${res.headers['content-type']} ${(res.text ?? '').slice(0, 300)}`;
          expect(res.status, ctx).toBeLessThan(500);
          if (res.status >= 400) {
            expect(res.headers['content-type'] ?? '', ctx).toContain(PROBLEM_MEDIA_TYPE);
            const problem = JSON.parse(res.text) as { status?: number; title?: string };
            expect(problem.status, ctx).toBe(res.status);
            expect(typeof problem.title, ctx).toBe('string');
          }
        }),
        { seed: SEED, numRuns: 20 },
      );
    }
  }, 120_000);

  it('valid bodies carrying awkward unicode (NUL, lone surrogates, RTL override) never cause a 5xx', async () => {
    const cases: [string, (s: string) => Body][] = [
      ['POST /api/teams/:teamId/packs', (s) => ({ name: `u ${s}`, description: s })],
      ['PATCH /api/auth/me', (s) => ({ name: `u ${s}` })],
      ['POST /api/teams/:teamId/packs/:pack/curves', (s) => ({ document: { ...doc(`u ${s} ${randomBytes(3).toString('hex')}`), description: s } })],
      ['POST /api/teams/:teamId/tokens', (s) => ({ name: `u ${s}` })],
      ['POST /api/teams/:teamId/packs/:pack/versions/:number/reviews', (s) => ({ decision: 'request-changes', comment: `u ${s}` })],
    ];
    for (const [route, body] of cases) {
      for (const s of AWKWARD_STRINGS) {
        const res = await send(route, urlOf(route), JSON.stringify(body(s)));
        expect(res.status, `${route} with ${JSON.stringify(s)} → ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`).toBeLessThan(500);
        if (res.status === 400) expect(Object.keys(res.body.error.fields ?? {}).length, JSON.stringify(res.body)).toBeGreaterThan(0);
        if (res.status >= 400) expect(typeof res.body.error.message).toBe('string');
      }
    }
  }, 60_000);

  it('malformed JSON → 400 JSON on every write route; over the body limit → 413 JSON', async () => {
    const writes = routes.filter((r) => WRITE.test(r));
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...writes), notJson, async (route, raw) => {
        const res = await send(route, urlOf(route), raw);
        expect(res.status, `${route} ${JSON.stringify(raw)} → ${res.status}`).toBe(400);
        expect(res.headers['content-type']).toMatch(/application\/json/);
        expect(res.body.error.message).toMatch(/not valid JSON/);
      }),
      { seed: SEED, numRuns: 60 },
    );
    const big = JSON.stringify({ name: 'x'.repeat(6 * 1024 * 1024) });
    const res = await send('POST /api/teams/:teamId/packs', urlOf('POST /api/teams/:teamId/packs'), big);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('too_large');
  }, 60_000);

  it('malformed bearer tokens → 401 JSON, on reads and writes', async () => {
    const token = fc.oneof(
      fc.string({ maxLength: 80 }).filter((s) => !/[\r\n]/.test(s) && /^[\x20-\x7e]*$/.test(s)),
      fc.constantFrom('tgt_', 'tgt_x_y', `tgt_${'0'.repeat(32)}_${'A'.repeat(43)}`, `tgt_${'g'.repeat(32)}_${'A'.repeat(43)}`, 'inv_' + 'a'.repeat(80), 'Bearer', '\t', 'tgt_' + 'x'.repeat(4000)),
      fc.tuple(fc.uuid(), fc.base64String({ minLength: 40, maxLength: 48 })).map(([id, s]) => `tgt_${id.replace(/-/g, '')}_${s}`),
    );
    const scheme = fc.constantFrom('Bearer ', 'bearer ', 'Basic ', 'Token ', '', 'Bearer  ');
    await fc.assert(
      fc.asyncProperty(scheme, token, fc.boolean(), async (sch, tok, write) => {
        const url = `/api/teams/${fx.team}/packs`;
        const req = write ? request(t.app).post(url).send({ name: 'by a bad token' }) : request(t.app).get(url);
        const res = await req.set('Authorization', `${sch}${tok}`);
        expect(res.status, `${JSON.stringify(sch + tok)} → ${res.status} ${JSON.stringify(res.body)}`).toBe(401);
        expect(typeof res.body.error.message).toBe('string');
      }),
      { seed: SEED, numRuns: 60 },
    );
  }, 60_000);
});

describe('CSS easing strings that do not parse', () => {
  // W3C CSS Easing Functions Level 1 §2.2: cubic-bezier x1, x2 must be in [0, 1]; §2.3: steps() needs a
  // positive integer, and at least 2 with jump-none. Level 2: linear() needs at least two points
  // (recalled from the specification text; the parser's own tests cite the same sections).
  const INVALID = ['cubic-bezier(1.5, 0, 0.5, 1)', 'cubic-bezier(-0.1, 0, 0.5, 1)', 'cubic-bezier(0.1, 0.2, 0.3)', 'steps(0)', 'steps(1.5)', 'steps(1, jump-none)', 'steps(2, sideways)', 'linear()', 'linear(0)', 'ease-sideways', 'cubic-bezier(0.1, 0.2, 0.3, 1', 'cubic-bezier(NaN, 0, 1, 1)', 'steps(4,)', ''];

  it('known invalid strings → ok: false with a message and a position inside the text', () => {
    for (const s of INVALID) {
      const r = parseCssEasing(s);
      expect(r.ok, s).toBe(false);
      if (!r.ok) {
        expect(r.error.length, s).toBeGreaterThan(5);
        expect(r.position, s).toBeGreaterThanOrEqual(0);
        expect(r.position, s).toBeLessThanOrEqual(s.length);
      }
    }
  });

  it('generated strings (and near-valid ones with a character changed) never throw; what parses evaluates to finite values', () => {
    const valid = ['ease', 'cubic-bezier(0.25, 0.1, 0.25, 1)', 'steps(4, jump-none)', 'linear(0, 0.25 75%, 1)', 'ease-in-out', 'steps(3, start)'];
    const nearValid = fc.tuple(fc.constantFrom(...valid), fc.nat(), fc.string({ maxLength: 3 }), fc.nat({ max: 3 })).map(([s, at, ins, del]) => {
      const i = at % (s.length + 1);
      return s.slice(0, i) + ins + s.slice(i + del);
    });
    fc.assert(
      fc.property(fc.oneof(fc.string({ maxLength: 60 }), nearValid, fc.constantFrom('x'.repeat(100_000), '('.repeat(10_000), `linear(${'0, '.repeat(5000)}1)`)), (s) => {
        const r = parseCssEasing(s);
        if (r.ok) {
          for (const x of [-0.5, 0, 0.3, 1, 1.5]) expect(Number.isFinite(evaluateCssEasing(r.easing, x)), `${s} at ${x}`).toBe(true);
        } else {
          expect(r.error.length).toBeGreaterThan(5);
          expect(Number.isInteger(r.position)).toBe(true);
        }
      }),
      { seed: SEED, numRuns: 500 },
    );
  });

  it('the CLI answers an unparsable easing with a clear error and exit code 1 (not a stack trace)', () => {
    const r = spawnSync(process.execPath, ['--import', 'tsx', 'cli/index.ts', 'eval', 'cubic-bezier(1.5, 0, 0.5, 1)', '--at', '0.5'], { encoding: 'utf8', cwd: process.cwd(), timeout: 30_000 });
    expect(r.status, r.stderr).toBe(1);
    expect(r.stderr).toMatch(/^error: INPUT is not a file and not a CSS easing function: .+/);
    expect(r.stderr).not.toMatch(/\n\s+at /);
    expect(r.stdout).toBe('');
  }, 40_000);
});
