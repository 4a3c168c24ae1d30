import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail } from '../support/accounts';
import { proposeAndWait } from '../support/bakes';
import type { CurveDocument, Key } from '../../shared/curve';
import type { ActivityItem, ActivityPage } from '../../shared/schemas/activity';

const PASSWORD = 'activity password 1';
const key = (time: number, value: number): Key => ({ time, value, slopeIn: 0, slopeOut: 0, rule: 'manual', slopes: 'joined' });
const doc = (name: string, top = 1): CurveDocument => ({
  format: 'tangentry.curve', version: 1, name, units: { time: 's', value: 'progress' }, before: 'clamp', after: 'clamp', frameRate: 60,
  drives: 'position', tags: [], keys: [key(0, 0), key(1, top)], segments: [{ kind: 'linear' }],
});

describe('team activity: every action through the API becomes a row in words; filters; keyset pages', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let team = '';
  let animator = '';
  let lead = '';
  let engineer = '';
  let outsider = '';
  let animatorId = '';
  const url = () => `/api/teams/${team}/activity`;

  beforeAll(async () => {
    t = await testApp({ label: 'activity', seed: true });
    team = await teamId('ui-motion');
    const who = async (role: 'animator' | 'lead' | 'engineer', teams: Record<string, typeof role | 'admin'>) => {
      const email = uniqueEmail(`activity-${role}`);
      const id = await createPerson({ email, password: PASSWORD, name: `Activity ${role}`, teams });
      return { id, cookie: await signIn(t.app, email, PASSWORD) };
    };
    const a = await who('animator', { 'ui-motion': 'animator' });
    animator = a.cookie;
    animatorId = a.id;
    lead = (await who('lead', { 'ui-motion': 'lead' })).cookie;
    engineer = (await who('engineer', { 'ui-motion': 'engineer' })).cookie;
    outsider = (await who('lead', { 'gameplay-feel': 'admin' })).cookie;
  });
  afterAll(async () => t?.close());

  const send = (method: 'post' | 'put' | 'patch' | 'delete', cookie: string, path: string, body?: object) =>
    request(t.app)[method](path).set('Cookie', cookie).set('Origin', ORIGIN).send(body);
  const get = (cookie: string, query = '') => request(t.app).get(`${url()}${query}`).set('Cookie', cookie);
  /** Proposes through the real route and waits for the background bake (tests/support/bakes.ts). */
  const propose = async (slug: string, changelog: string) => (await proposeAndWait(t.app, animator, team, slug, changelog)).version.number;

  it('records packs, curves, profiles, versions, reviews and channel moves with the right words', async () => {
    const base = `/api/teams/${team}/packs/activity-pack`;
    expect((await send('post', animator, `/api/teams/${team}/packs`, { name: 'Activity pack' })).status).toBe(201);
    expect((await send('post', animator, `/api/teams/${team}/packs`, { name: 'Activity other' })).status).toBe(201);
    const ramp = (await send('post', animator, `${base}/curves`, { document: doc('ramp') })).body.curve;
    const lift = (await send('post', animator, `${base}/curves`, { document: doc('lift') })).body.curve;
    expect((await send('put', animator, `${base}/curves/${ramp.id}`, { document: doc('ramp', 0.9), revision: 1 })).status).toBe(200);
    expect((await send('post', animator, `${base}/reorder`, { curveIds: [lift.id, ramp.id] })).status).toBe(200);
    expect((await send('post', animator, `${base}/curves/${lift.id}/copy`, { toPack: 'activity-other', name: 'lift-copy' })).status).toBe(201);
    const extra = (await send('post', animator, `${base}/curves`, { document: doc('extra') })).body.curve;
    expect((await send('post', animator, `${base}/curves/${extra.id}/move`, { toPack: 'activity-other' })).status).toBe(200);
    const spare = (await send('post', animator, `${base}/curves`, { document: doc('spare') })).body.curve;
    expect((await send('delete', animator, `${base}/curves/${spare.id}`)).status).toBe(204);
    expect((await send('patch', animator, base, { name: 'Activity pack renamed' })).status).toBe(200);

    const v1 = await propose('activity-pack', 'first cut');
    expect((await send('post', lead, `${base}/versions/${v1}/reviews`, { decision: 'approve' })).status).toBe(201);
    expect((await send('put', lead, `${base}/channels/shipping`, { version: v1 })).status).toBe(200);
    expect((await send('put', animator, `${base}/curves/${ramp.id}`, { document: doc('ramp', 0.8), revision: 2 })).status).toBe(200);
    const v2 = await propose('activity-pack', 'lower ramp');
    expect((await send('post', lead, `${base}/versions/${v2}/reviews`, { decision: 'request-changes', comment: 'too low' })).status).toBe(201);
    expect((await send('post', lead, `${base}/versions/${v2}/reviews`, { decision: 'approve' })).status).toBe(201);
    expect((await send('put', lead, `${base}/channels/shipping`, { version: v2 })).status).toBe(200);
    expect((await send('patch', animator, `/api/teams/${team}/packs/activity-other`, { archived: true })).status).toBe(200);
    expect((await send('patch', animator, `/api/teams/${team}/packs/activity-other`, { archived: false })).status).toBe(200);

    const profile = { name: 'Activity target', tolerance: { mode: 'absolute', value: 1e-3 }, kernel: 'linear', layout: 'uniform', encoding: 'f32' };
    const made = await send('post', engineer, `/api/teams/${team}/profiles`, profile);
    expect(made.status).toBe(201);
    expect((await send('put', engineer, `/api/teams/${team}/profiles/${made.body.profile.id}`, { profile: { ...profile, tolerance: { mode: 'absolute', value: 2e-3 } }, version: 1 })).status).toBe(200);
    expect((await send('delete', engineer, `/api/teams/${team}/profiles/${made.body.profile.id}`)).status).toBe(204);

    const res = await get(animator, '?limit=100');
    expect(res.status).toBe(200);
    const items = (res.body as ActivityPage).items;
    const words = items.map((i) => `${i.actor?.name ?? 'Tangentry'} ${i.words}`);
    for (const expected of [
      'Activity animator created the pack activity-pack',
      'Activity animator added the curve ramp to activity-pack',
      'Activity animator saved ramp in activity-pack (revision 2)',
      'Activity animator reordered the curves of activity-pack',
      'Activity animator copied the curve lift from activity-pack to activity-other as lift-copy',
      'Activity animator moved the curve extra from activity-pack to activity-other',
      'Activity animator deleted the curve spare from activity-pack',
      'Activity animator renamed the pack activity-pack from “Activity pack” to “Activity pack renamed”',
      `Activity animator proposed v${v1} of activity-pack`,
      `Activity lead approved v${v1} of activity-pack`,
      `Activity lead pointed shipping of activity-pack at v${v1}`,
      `Activity lead asked for changes to v${v2} of activity-pack`,
      `Activity lead moved shipping of activity-pack from v${v1} to v${v2}`,
      'Activity animator archived the pack activity-other',
      'Activity animator restored the pack activity-other',
      'Activity engineer added the target profile Activity target',
      'Activity engineer changed the target profile Activity target',
      'Activity engineer deleted the target profile Activity target',
    ]) expect(words).toContain(expected);
    // newest first
    const times = items.map((i) => Date.parse(i.at));
    expect([...times].sort((a, b) => b - a)).toEqual(times);
    expect(words[0]).toBe('Activity engineer deleted the target profile Activity target');
    // links: the channel move names the version it moved to; a saved curve links to the curve
    const moved = items.find((i) => i.type === 'channel.moved' && i.data.from === v1)!;
    expect(moved.links).toEqual({ pack: '/packs/activity-pack', version: `/packs/activity-pack/versions/${v2}` });
    const saved = items.find((i) => i.type === 'curve.saved')!;
    expect(saved.links.curve).toBe(`/packs/activity-pack/curves/${ramp.id}`);
  });

  it('filters by type, pack, person and subject kind, and counts', async () => {
    const byType = (await get(lead, '?type=channel.moved&count=true')).body as ActivityPage;
    expect(byType.items.length).toBe(2);
    expect(byType.total).toBe(2);
    expect(byType.items.every((i) => i.type === 'channel.moved')).toBe(true);
    const byPack = (await get(lead, '?pack=activity-other&limit=100')).body as ActivityPage;
    expect(byPack.items.map((i) => i.type).sort()).toEqual(['pack.archived', 'pack.created', 'pack.restored']);
    const byActor = (await get(lead, `?actor=${animatorId}&limit=100`)).body as ActivityPage;
    expect(byActor.items.length).toBeGreaterThan(10);
    expect(byActor.items.every((i) => i.actor?.id === animatorId)).toBe(true);
    const bySubject = (await get(lead, '?subject=profile')).body as ActivityPage;
    expect(bySubject.items.map((i) => i.type)).toEqual(['profile.deleted', 'profile.updated', 'profile.created']);
    const none = (await get(lead, '?pack=no-such-pack&count=true')).body as ActivityPage;
    expect(none).toEqual({ items: [], older: null, newer: null, total: 0 });
  });

  it('pages across more rows than the limit with no duplicates and no gaps, both ways', async () => {
    const all = ((await get(lead, '?limit=100&count=true')).body as ActivityPage);
    expect(all.total).toBe(all.items.length);
    expect(all.items.length).toBeGreaterThan(20);
    const seen: ActivityItem[] = [];
    const pages: ActivityPage[] = [];
    let cursor: string | null = '';
    while (cursor !== null) {
      const page = (await get(lead, `?limit=7${cursor ? `&before=${cursor}` : ''}`)).body as ActivityPage;
      expect(page.items.length).toBeLessThanOrEqual(7);
      pages.push(page);
      seen.push(...page.items);
      cursor = page.older;
    }
    expect(seen.map((i) => i.id)).toEqual(all.items.map((i) => i.id));
    expect(pages[0]!.newer).toBeNull();
    expect(pages[pages.length - 1]!.older).toBeNull();
    // "Newer" from the last page walks back up through the same pages
    let back = pages[pages.length - 1]!;
    for (let i = pages.length - 2; i >= 0; i--) {
      back = (await get(lead, `?limit=7&after=${back.newer}`)).body as ActivityPage;
      expect(back.items.map((x) => x.id)).toEqual(pages[i]!.items.map((x) => x.id));
    }
    expect(back.newer).toBeNull();
  });

  it('answers 400 naming the bad filter', async () => {
    for (const [q, field] of [['?type=curve.exploded', 'type'], ['?pack=Not A Slug', 'pack'], ['?subject=team', 'subject'], ['?limit=0', 'limit'], ['?limit=1000', 'limit'], ['?before=%21%21', 'before'], ['?before=AAAAAAAAAAAA', 'before'], ['?actor=a%20b', 'actor']] as const) {
      const res = await get(lead, q);
      expect(res.status, q).toBe(400);
      expect(Object.keys(res.body.error.fields), q).toEqual([field]);
      expect(res.body.error.fields[field]).toMatch(new RegExp(`^${field}:`));
    }
  });

  it('is the team’s own: a member of another team is refused, and sees none of it in their own team', async () => {
    // requireTeam answers 404 to a non-member, so team ids cannot be probed (server/auth/require-role.ts)
    expect((await get(outsider)).status).toBe(404);
    const other = await teamId('gameplay-feel');
    const theirs = (await request(t.app).get(`/api/teams/${other}/activity?pack=activity-pack`).set('Cookie', outsider)).body as ActivityPage;
    expect(theirs.items).toEqual([]);
    expect((await request(t.app).get(url())).status).toBe(401);
  });
});
