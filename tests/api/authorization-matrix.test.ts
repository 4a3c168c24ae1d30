/**
 * AUTHORIZATION MATRIX — every API route, every kind of caller, the expected status.
 *
 * How it works: MATRIX below lists each route as "METHOD /api/path" (the Express path pattern) with
 * a request builder and the status expected for: anonymous, each role (a member of "UI Motion" with
 * that role), a revoked service token and a valid one (both of UI Motion), and `otherTeam` (an admin of
 * "Gameplay Feel" only). Requests target UI Motion. The first test walks the real app's router stack
 * (tests/support/route-walk.ts) and FAILS when the app has a route the matrix does not list, or the
 * matrix lists one the app does not have.
 *
 * Extending it (every later issue must): add one entry per new route. Use the helpers: `adminOnly`,
 * `forRoles` (pass the roles that succeed — read them from shared/schemas/roles.ts PERMISSIONS), `person`
 * (any signed-in person), `everyone` (public). `fresh: true` when the request ends the caller's session.
 * `build` may create what the request needs (a throwaway member to remove …) so every caller gets its own.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { randomBytes } from 'node:crypto';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail } from '../support/accounts';
import { listRoutes } from '../support/route-walk';
import { ROLES, type Role } from '../../shared/schemas/roles';
import { createToken, revokeToken } from '../../server/tokens/tokens.service';
import { insertInvitation } from '../../server/invitations/invitations.repository';
import { createProfile } from '../../server/profiles/profiles.service';
import { createCurve, createPack } from '../../server/packs/packs.service';
import { DEMO_PACKS } from '../../server/seed/demo-packs';
import { proposeVersion, review, type Storage } from '../../server/versions/versions.service';
import { release } from '../../server/channels/channels.service';
import { insertDeliveries, insertWebhook } from '../../server/webhooks/webhooks.repository';
import { snapshotProposal } from '../../server/versions/bakes.service';
import { recordFailure } from '../../server/versions/bakes.repository';
import '../support/bakes'; // stops the pg-boss that proposing and retrying start

const matrixProfile = () => ({ tolerance: { mode: 'absolute', value: 5e-4 }, kernel: 'hermite', layout: 'adaptive', encoding: 'f32' });

const someone = { kind: 'anonymous' } as const;
const matrixDoc = (name: string) => ({ ...DEMO_PACKS[0]!.curves[0]!, name });
/** A fresh pack of UI Motion with `curves` curves (each caller gets its own). */
async function matrixPack(team: string, curves = 1) {
  const pack = await createPack(team, { name: `Matrix ${randomBytes(4).toString('hex')}`, description: '', frameRate: 60, tags: [] });
  const ids: string[] = [];
  for (let i = 0; i < curves; i++) ids.push((await createCurve(someone, team, pack.slug, matrixDoc(`curve-${i}`))).id);
  return { slug: pack.slug, ids, url: `/api/teams/${team}/packs/${pack.slug}` };
}
const EDITORS = ['admin', 'lead', 'animator'] as const;
/** A fresh pack with `count` proposed versions (v1 …); the URL names the last. */
async function matrixVersion(e: Env, count = 1) {
  const p = await matrixPack(e.team);
  let v = await proposeVersion(e.storage, someone, e.team, p.slug, 'matrix version', e.adminId);
  for (let i = 1; i < count; i++) v = await proposeVersion(e.storage, someone, e.team, p.slug, 'matrix version', e.adminId);
  return { url: `${p.url}/versions/${v.number}`, artifactId: v.artifacts[1]!.id };
}

/** A fresh pack with one recorded proposal (not queued); `failed` marks its bake failed, as after a storage outage. */
async function matrixBake(e: Env, failed = false) {
  const p = await matrixPack(e.team);
  const b = await snapshotProposal(e.storage, someone, e.team, p.slug, 'matrix bake', e.adminId);
  if (failed) await recordFailure(b.id, { target: 'Console', curve: null, reason: 'matrix: storage down' }, true);
  return { url: `${p.url}/bakes`, id: b.id };
}

/** A webhook of UI Motion to act on (each caller gets its own). */
const matrixWebhook = (e: Env) => insertWebhook({ teamId: e.team, url: 'https://builds.corvid-lantern.test/hooks', description: '', events: ['channel.moved'], secret: 'whsec_matrix', createdBy: e.adminId });

/** The /api/v1 URL of a fresh approved v1 released on `shipping` (build-server API, issue 8). */
async function matrixV1(e: Env) {
  const v = await matrixVersion(e);
  const slug = v.url.split('/packs/')[1]!.split('/')[0]!;
  await review(someone, e.team, slug, 1, e.adminId, { decision: 'approve', comment: '' });
  await release(someone, e.team, slug, 'shipping', 1, e.adminId);
  return { version: v.url.replace(/^\/api\//, '/api/v1/'), channel: `/api/v1/teams/${e.team}/packs/${slug}/channels/shipping` };
}

const WHO = ['anonymous', ...ROLES, 'revokedToken', 'validToken', 'otherTeam'] as const;
type Who = (typeof WHO)[number];
type Expect = Record<Who, number>;

interface Built {
  url: string;
  body?: unknown;
}
interface Entry {
  route: string;
  build: (env: Env) => Promise<Built> | Built;
  expect: Expect;
  fresh?: boolean;
}
interface Env {
  team: string;
  adminId: string;
  storage: Storage;
}

const PASSWORD = 'matrix password 1';

/** Status for anonymous 401, a revoked token 401, a valid token `token`, another team's admin `other`. */
function grid(ok: number, roles: readonly Role[], opts: { denied?: number; token?: number; other?: number } = {}): Expect {
  const e = { anonymous: 401, revokedToken: 401, validToken: opts.token ?? 403, otherTeam: opts.other ?? 404 } as Expect;
  for (const r of ROLES) e[r] = roles.includes(r) ? ok : (opts.denied ?? 403);
  return e;
}
const adminOnly = (ok: number) => grid(ok, ['admin']);
const forRoles = (ok: number, roles: readonly Role[], opts?: { token?: number }) => grid(ok, roles, opts);
/** Any signed-in person, whatever their team; tokens refused. */
const person = (ok: number) => grid(ok, ROLES, { other: ok });
/** Public: the same answer for everyone. */
const everyone = (status: number) => Object.fromEntries(WHO.map((w) => [w, status])) as Expect;

async function throwawayMember(): Promise<string> {
  return createPerson({ email: uniqueEmail('target'), password: PASSWORD, teams: { 'ui-motion': 'viewer' } });
}

const MATRIX: Entry[] = [
  { route: 'GET /api/health', build: () => ({ url: '/api/health' }), expect: everyone(200) },
  { route: 'GET /api/auth/demo-accounts', build: () => ({ url: '/api/auth/demo-accounts' }), expect: everyone(200) },
  { route: 'POST /api/auth/sign-in', build: () => ({ url: '/api/auth/sign-in', body: { email: 'nobody@corvid-lantern.test', password: 'wrong' } }), expect: everyone(401) },
  { route: 'POST /api/auth/sign-out', build: () => ({ url: '/api/auth/sign-out' }), expect: person(204), fresh: true },
  { route: 'POST /api/auth/sign-out-everywhere', build: () => ({ url: '/api/auth/sign-out-everywhere' }), expect: person(204), fresh: true },
  { route: 'GET /api/auth/me', build: () => ({ url: '/api/auth/me' }), expect: person(200) },
  { route: 'PATCH /api/auth/me', build: () => ({ url: '/api/auth/me', body: { name: 'Matrix Person' } }), expect: person(200) },
  // a wrong current password: reaching 400 proves the guard let the person through, without changing anything
  { route: 'POST /api/auth/password', build: () => ({ url: '/api/auth/password', body: { currentPassword: 'not it', newPassword: 'another long one' } }), expect: person(400) },
  { route: 'POST /api/auth/password-reset', build: () => ({ url: '/api/auth/password-reset', body: { email: 'nobody@corvid-lantern.test' } }), expect: everyone(202) },
  { route: 'POST /api/auth/password-reset/complete', build: () => ({ url: '/api/auth/password-reset/complete', body: { token: 'rst_not_a_real_token', password: 'a long new password' } }), expect: everyone(400) },
  { route: 'GET /api/invitations/:token', build: () => ({ url: '/api/invitations/inv_not_a_real_token' }), expect: everyone(404) },
  { route: 'POST /api/invitations/accept', build: () => ({ url: '/api/invitations/accept', body: { token: 'inv_not_a_real_token', name: 'X', password: 'a long new password' } }), expect: everyone(404) },
  { route: 'GET /api/teams', build: () => ({ url: '/api/teams' }), expect: person(200) },
  // the home page's inbox (issue 7): any signed-in person sees only what is in their own teams
  { route: 'GET /api/me/inbox', build: () => ({ url: '/api/me/inbox' }), expect: person(200) },
  // in-app notices (issue 7 part 3): only one's own, any signed-in person, never a token
  { route: 'GET /api/me/notifications', build: () => ({ url: '/api/me/notifications' }), expect: person(200) },
  { route: 'POST /api/me/notifications/read', build: () => ({ url: '/api/me/notifications/read', body: { all: true } }), expect: person(200) },
  // team activity (issue 7 part 5): every member who is a person reads it; tokens do not
  { route: 'GET /api/teams/:teamId/activity', build: (e) => ({ url: `/api/teams/${e.team}/activity` }), expect: forRoles(200, ROLES) },
  // comments on a version (issue 7 part 3): every member who is a person reads and writes (leads review, animators answer)
  { route: 'GET /api/teams/:teamId/packs/:pack/versions/:number/comments', build: async (e) => ({ url: `${(await matrixVersion(e)).url}/comments` }), expect: forRoles(200, ROLES) },
  { route: 'POST /api/teams/:teamId/packs/:pack/versions/:number/comments', build: async (e) => ({ url: `${(await matrixVersion(e)).url}/comments`, body: { body: 'matrix comment' } }), expect: forRoles(201, ROLES) },
  { route: 'GET /api/teams/:teamId', build: (e) => ({ url: `/api/teams/${e.team}` }), expect: forRoles(200, ROLES, { token: 200 }) },
  { route: 'GET /api/teams/:teamId/members', build: (e) => ({ url: `/api/teams/${e.team}/members` }), expect: forRoles(200, ROLES) },
  {
    route: 'PATCH /api/teams/:teamId/members/:userId',
    build: async (e) => ({ url: `/api/teams/${e.team}/members/${await throwawayMember()}`, body: { role: 'animator' } }),
    expect: adminOnly(204),
  },
  { route: 'DELETE /api/teams/:teamId/members/:userId', build: async (e) => ({ url: `/api/teams/${e.team}/members/${await throwawayMember()}` }), expect: adminOnly(204) },
  { route: 'GET /api/teams/:teamId/invitations', build: (e) => ({ url: `/api/teams/${e.team}/invitations` }), expect: adminOnly(200) },
  { route: 'POST /api/teams/:teamId/invitations', build: (e) => ({ url: `/api/teams/${e.team}/invitations`, body: { email: uniqueEmail('matrix-invite'), role: 'viewer' } }), expect: adminOnly(201) },
  {
    route: 'DELETE /api/teams/:teamId/invitations/:invitationId',
    build: async (e) => {
      const inv = await insertInvitation({ id: crypto.randomUUID(), teamId: e.team, email: uniqueEmail('matrix-withdraw'), role: 'viewer', tokenHash: randomBytes(32).toString('hex'), invitedBy: e.adminId, expiresAt: new Date(Date.now() + 86_400_000) });
      return { url: `/api/teams/${e.team}/invitations/${inv.id}` };
    },
    expect: adminOnly(204),
  },
  { route: 'GET /api/teams/:teamId/tokens', build: (e) => ({ url: `/api/teams/${e.team}/tokens` }), expect: adminOnly(200) },
  { route: 'POST /api/teams/:teamId/tokens', build: (e) => ({ url: `/api/teams/${e.team}/tokens`, body: { name: 'matrix token' } }), expect: adminOnly(201) },
  {
    route: 'DELETE /api/teams/:teamId/tokens/:tokenId',
    build: async (e) => ({ url: `/api/teams/${e.team}/tokens/${(await createToken(e.team, { name: 'to revoke' }, e.adminId)).token.id}` }),
    expect: adminOnly(204),
  },
  // webhooks (issue 8 part 4): admins only (webhooks.manage), never service tokens, not even to read
  { route: 'GET /api/teams/:teamId/webhooks', build: (e) => ({ url: `/api/teams/${e.team}/webhooks` }), expect: adminOnly(200) },
  { route: 'POST /api/teams/:teamId/webhooks', build: (e) => ({ url: `/api/teams/${e.team}/webhooks`, body: { url: 'https://builds.corvid-lantern.test/hooks', events: ['channel.moved'] } }), expect: adminOnly(201) },
  { route: 'PATCH /api/teams/:teamId/webhooks/:webhookId', build: async (e) => ({ url: `/api/teams/${e.team}/webhooks/${(await matrixWebhook(e)).id}`, body: { description: 'renamed' } }), expect: adminOnly(200) },
  { route: 'DELETE /api/teams/:teamId/webhooks/:webhookId', build: async (e) => ({ url: `/api/teams/${e.team}/webhooks/${(await matrixWebhook(e)).id}` }), expect: adminOnly(204) },
  { route: 'POST /api/teams/:teamId/webhooks/:webhookId/rotate-secret', build: async (e) => ({ url: `/api/teams/${e.team}/webhooks/${(await matrixWebhook(e)).id}/rotate-secret` }), expect: adminOnly(200) },
  { route: 'POST /api/teams/:teamId/webhooks/:webhookId/ping', build: async (e) => ({ url: `/api/teams/${e.team}/webhooks/${(await matrixWebhook(e)).id}/ping` }), expect: adminOnly(202) },
  { route: 'GET /api/teams/:teamId/webhooks/:webhookId/deliveries', build: async (e) => ({ url: `/api/teams/${e.team}/webhooks/${(await matrixWebhook(e)).id}/deliveries` }), expect: adminOnly(200) },
  {
    route: 'POST /api/teams/:teamId/webhooks/:webhookId/deliveries/:deliveryId/redeliver',
    build: async (e) => { const w = await matrixWebhook(e); const [d] = await insertDeliveries([{ webhookId: w.id, eventType: 'ping', eventId: crypto.randomUUID(), payload: '{}' }]); return { url: `/api/teams/${e.team}/webhooks/${w.id}/deliveries/${d!.id}/redeliver` }; },
    expect: adminOnly(202),
  },
  // public formats
  { route: 'GET /api/schemas/curve.schema.json', build: () => ({ url: '/api/schemas/curve.schema.json' }), expect: everyone(200) },
  // target profiles (issue 5): members and the team's tokens read; engineers and admins edit
  { route: 'GET /api/teams/:teamId/profiles', build: (e) => ({ url: `/api/teams/${e.team}/profiles` }), expect: forRoles(200, ROLES, { token: 200 }) },
  {
    route: 'POST /api/teams/:teamId/profiles',
    build: (e) => ({ url: `/api/teams/${e.team}/profiles`, body: { ...matrixProfile(), name: `Matrix ${randomBytes(4).toString('hex')}` } }),
    expect: forRoles(201, ['admin', 'engineer']),
  },
  {
    route: 'PUT /api/teams/:teamId/profiles/:profileId',
    build: async (e) => {
      const p = await createProfile(e.team, { ...matrixProfile(), name: `Matrix ${randomBytes(4).toString('hex')}` });
      return { url: `/api/teams/${e.team}/profiles/${p.id}`, body: { profile: { ...p.profile, tolerance: { mode: 'absolute', value: 1e-3 } }, version: p.version } };
    },
    expect: forRoles(200, ['admin', 'engineer']),
  },
  {
    route: 'DELETE /api/teams/:teamId/profiles/:profileId',
    build: async (e) => ({ url: `/api/teams/${e.team}/profiles/${(await createProfile(e.team, { ...matrixProfile(), name: `Matrix ${randomBytes(4).toString('hex')}` })).id}` }),
    expect: forRoles(204, ['admin', 'engineer']),
  },
  // packs and curves (issue 7): members and the team's tokens read; curves.edit (admin, lead, animator) writes
  { route: 'GET /api/teams/:teamId/packs', build: (e) => ({ url: `/api/teams/${e.team}/packs` }), expect: forRoles(200, ROLES, { token: 200 }) },
  { route: 'POST /api/teams/:teamId/packs', build: (e) => ({ url: `/api/teams/${e.team}/packs`, body: { name: `Matrix ${randomBytes(4).toString('hex')}` } }), expect: forRoles(201, EDITORS) },
  { route: 'GET /api/teams/:teamId/packs/:pack', build: (e) => ({ url: `/api/teams/${e.team}/packs/menu-transitions` }), expect: forRoles(200, ROLES, { token: 200 }) },
  { route: 'PATCH /api/teams/:teamId/packs/:pack', build: async (e) => ({ url: (await matrixPack(e.team, 0)).url, body: { name: 'Renamed', archived: true } }), expect: forRoles(200, EDITORS) },
  { route: 'GET /api/teams/:teamId/packs/:pack/curves', build: (e) => ({ url: `/api/teams/${e.team}/packs/menu-transitions/curves` }), expect: forRoles(200, ROLES, { token: 200 }) },
  { route: 'POST /api/teams/:teamId/packs/:pack/curves', build: async (e) => ({ url: `${(await matrixPack(e.team, 0)).url}/curves`, body: { document: matrixDoc('new-one') } }), expect: forRoles(201, EDITORS) },
  // bulk upload (issue 7): a JSON body holds no files, so 400 proves the guard let an editor through (tests/api/uploads.test.ts sends files)
  { route: 'POST /api/teams/:teamId/packs/:pack/uploads', build: async (e) => ({ url: `${(await matrixPack(e.team, 0)).url}/uploads`, body: {} }), expect: forRoles(400, EDITORS) },
  {
    route: 'POST /api/teams/:teamId/packs/:pack/reorder',
    build: async (e) => { const p = await matrixPack(e.team, 2); return { url: `${p.url}/reorder`, body: { curveIds: [...p.ids].reverse() } }; },
    expect: forRoles(200, EDITORS),
  },
  { route: 'GET /api/teams/:teamId/packs/:pack/curves/:curveId', build: async (e) => { const p = await matrixPack(e.team); return { url: `${p.url}/curves/${p.ids[0]}` }; }, expect: forRoles(200, ROLES, { token: 200 }) },
  {
    route: 'PUT /api/teams/:teamId/packs/:pack/curves/:curveId',
    build: async (e) => { const p = await matrixPack(e.team); return { url: `${p.url}/curves/${p.ids[0]}`, body: { document: matrixDoc('curve-0'), revision: 1 } }; },
    expect: forRoles(200, EDITORS),
  },
  { route: 'DELETE /api/teams/:teamId/packs/:pack/curves/:curveId', build: async (e) => { const p = await matrixPack(e.team); return { url: `${p.url}/curves/${p.ids[0]}` }; }, expect: forRoles(204, EDITORS) },
  {
    route: 'POST /api/teams/:teamId/packs/:pack/curves/:curveId/move',
    build: async (e) => { const [a, b] = [await matrixPack(e.team), await matrixPack(e.team, 0)]; return { url: `${a.url}/curves/${a.ids[0]}/move`, body: { toPack: b.slug } }; },
    expect: forRoles(200, EDITORS),
  },
  {
    route: 'POST /api/teams/:teamId/packs/:pack/curves/:curveId/copy',
    build: async (e) => { const [a, b] = [await matrixPack(e.team), await matrixPack(e.team, 0)]; return { url: `${a.url}/curves/${a.ids[0]}/copy`, body: { toPack: b.slug } }; },
    expect: forRoles(201, EDITORS),
  },
  // pack versions (issue 7): members and tokens read and download; versions.propose (admin, lead, animator) proposes
  { route: 'GET /api/teams/:teamId/packs/:pack/versions', build: (e) => ({ url: `/api/teams/${e.team}/packs/menu-transitions/versions` }), expect: forRoles(200, ROLES, { token: 200 }) },
  { route: 'POST /api/teams/:teamId/packs/:pack/versions', build: async (e) => ({ url: `${(await matrixPack(e.team)).url}/versions`, body: { changelog: 'matrix proposal' } }), expect: forRoles(202, ['admin', 'lead', 'animator']) },
  // background bakes (issue 7 part 2): members and tokens follow them; versions.propose retries a failed one
  { route: 'GET /api/teams/:teamId/packs/:pack/bakes', build: async (e) => ({ url: (await matrixBake(e)).url }), expect: forRoles(200, ROLES, { token: 200 }) },
  { route: 'GET /api/teams/:teamId/packs/:pack/bakes/:bakeId', build: async (e) => { const b = await matrixBake(e); return { url: `${b.url}/${b.id}` }; }, expect: forRoles(200, ROLES, { token: 200 }) },
  { route: 'POST /api/teams/:teamId/packs/:pack/bakes/:bakeId/retry', build: async (e) => { const b = await matrixBake(e, true); return { url: `${b.url}/${b.id}/retry` }; }, expect: forRoles(202, ['admin', 'lead', 'animator']) },
  { route: 'GET /api/teams/:teamId/packs/:pack/versions/:number', build: async (e) => ({ url: (await matrixVersion(e)).url }), expect: forRoles(200, ROLES, { token: 200 }) },
  {
    route: 'GET /api/teams/:teamId/packs/:pack/versions/:number/artifacts/:artifactId',
    build: async (e) => { const v = await matrixVersion(e); return { url: `${v.url}/artifacts/${v.artifactId}` }; },
    expect: forRoles(200, ROLES, { token: 200 }),
  },
  { route: 'GET /api/teams/:teamId/packs/:pack/versions/:number/compare', build: async (e) => { const v = await matrixVersion(e, 2); return { url: `${v.url}/compare` }; }, expect: forRoles(200, ROLES, { token: 200 }) },
  { route: 'POST /api/teams/:teamId/packs/:pack/versions/:number/reviews', build: async (e) => ({ url: `${(await matrixVersion(e)).url}/reviews`, body: { decision: 'approve' } }), expect: forRoles(201, ['admin', 'lead']) },
  // channels (issue 7): members and tokens read; channels.release (admin, lead) releases an approved version
  { route: 'GET /api/teams/:teamId/packs/:pack/channels', build: (e) => ({ url: `/api/teams/${e.team}/packs/menu-transitions/channels` }), expect: forRoles(200, ROLES, { token: 200 }) },
  {
    route: 'PUT /api/teams/:teamId/packs/:pack/channels/:channel',
    build: async (e) => {
      const v = await matrixVersion(e);
      const slug = v.url.split('/packs/')[1]!.split('/')[0]!;
      await review(someone, e.team, slug, 1, e.adminId, { decision: 'approve', comment: '' });
      return { url: v.url.replace(/versions\/1$/, 'channels/shipping'), body: { version: 1 } };
    },
    expect: forRoles(200, ['admin', 'lead']),
  },
  // build-server API v1 (issue 8): the document is public; whoami for any token or person; members and tokens read and download
  { route: 'GET /api/v1/openapi.json', build: () => ({ url: '/api/v1/openapi.json' }), expect: everyone(200) },
  { route: 'GET /api/v1/whoami', build: () => ({ url: '/api/v1/whoami' }), expect: { ...person(200), validToken: 200 } },
  { route: 'GET /api/v1/teams/:teamId/packs', build: (e) => ({ url: `/api/v1/teams/${e.team}/packs` }), expect: forRoles(200, ROLES, { token: 200 }) },
  { route: 'GET /api/v1/teams/:teamId/packs/:pack/channels/:channel', build: async (e) => ({ url: (await matrixV1(e)).channel }), expect: forRoles(200, ROLES, { token: 200 }) },
  { route: 'GET /api/v1/teams/:teamId/packs/:pack/versions/:number', build: async (e) => ({ url: (await matrixV1(e)).version }), expect: forRoles(200, ROLES, { token: 200 }) },
  { route: 'GET /api/v1/teams/:teamId/packs/:pack/versions/:number/source', build: async (e) => ({ url: `${(await matrixV1(e)).version}/source` }), expect: forRoles(200, ROLES, { token: 200 }) },
  { route: 'GET /api/v1/teams/:teamId/packs/:pack/versions/:number/artifacts/:target/:format', build: async (e) => ({ url: `${(await matrixV1(e)).version}/artifacts/console/binary` }), expect: forRoles(200, ROLES, { token: 200 }) },
  // admins of any team read the outbox: otherTeam is an admin of Gameplay Feel
  { route: 'GET /api/outbox', build: () => ({ url: '/api/outbox' }), expect: { ...forRoles(200, ['admin']), otherTeam: 200 } },
];

describe('authorization matrix', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  const emails = {} as Record<Exclude<Who, 'anonymous' | 'revokedToken' | 'validToken'>, string>;
  const cookies = new Map<Who, string>();
  let env: Env;
  let validToken = '';
  let revokedToken = '';

  beforeAll(async () => {
    t = await testApp({ label: 'matrix', seed: true, env: { AUTH_RATE_LIMIT: '100000' } });
    const team = await teamId('ui-motion');
    let adminId = '';
    for (const role of ROLES) {
      emails[role] = uniqueEmail(`matrix-${role}`);
      const id = await createPerson({ email: emails[role], password: PASSWORD, teams: { 'ui-motion': role } });
      if (role === 'admin') adminId = id;
    }
    emails.otherTeam = uniqueEmail('matrix-other');
    await createPerson({ email: emails.otherTeam, password: PASSWORD, teams: { 'gameplay-feel': 'admin' } });
    env = { team, adminId, storage: { s3: t.ctx.s3, bucket: t.config.s3.bucket } };
    validToken = (await createToken(team, { name: 'matrix valid' }, adminId)).secret;
    const revoked = await createToken(team, { name: 'matrix revoked' }, adminId);
    await revokeToken(team, revoked.token.id);
    revokedToken = revoked.secret;
  });
  afterAll(async () => t?.close());

  it('lists every route of the app, and only those', () => {
    const inApp = listRoutes(t.app).filter((r) => r.split(' ')[1]!.startsWith('/api/')).sort();
    const inMatrix = MATRIX.map((e) => e.route).sort();
    expect(inApp.filter((r) => !inMatrix.includes(r)), 'routes the matrix does not list: add them to MATRIX').toEqual([]);
    expect(inMatrix.filter((r) => !inApp.includes(r)), 'matrix entries with no route in the app').toEqual([]);
    expect(new Set(inMatrix).size).toBe(inMatrix.length);
  });

  async function cookieFor(who: Who, fresh: boolean): Promise<string> {
    if (!fresh && cookies.has(who)) return cookies.get(who)!;
    const c = await signIn(t.app, emails[who as keyof typeof emails], PASSWORD);
    if (!fresh) cookies.set(who, c);
    return c;
  }

  for (const entry of MATRIX) {
    it(entry.route, async () => {
      const [method] = entry.route.split(' ') as [string];
      const got = {} as Expect;
      for (const who of WHO) {
        const built = await entry.build(env);
        let req = request(t.app)[method.toLowerCase() as 'get'](built.url);
        if (who === 'validToken') req = req.set('Authorization', `Bearer ${validToken}`);
        else if (who === 'revokedToken') req = req.set('Authorization', `Bearer ${revokedToken}`);
        else {
          req = req.set('Origin', ORIGIN);
          if (who !== 'anonymous') req = req.set('Cookie', await cookieFor(who, entry.fresh === true));
        }
        const res = built.body === undefined ? await req : await req.send(built.body as object);
        got[who] = res.status;
      }
      // sign-out-everywhere ends the cached sessions too
      if (entry.fresh) cookies.clear();
      expect(got).toEqual(entry.expect);
    });
  }
});
