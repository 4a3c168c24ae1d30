import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail } from '../support/accounts';
import { proposeAndWait } from '../support/bakes';
import type { InboxDto, InboxItem } from '../../shared/schemas/inbox';

const PASSWORD = 'inbox password 1';
const PACK = 'menu-transitions';

describe('GET /api/me/inbox: reviews to do, my proposals, recent releases — each for the right person', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let team = '';
  let lead = '';
  let animator = '';
  let outsider = '';
  let viewer = '';

  beforeAll(async () => {
    t = await testApp({ label: 'inbox', seed: true });
    team = await teamId('ui-motion');
    const people: Record<string, string> = {};
    const who = { lead: { 'ui-motion': 'lead' }, animator: { 'ui-motion': 'animator' }, viewer: { 'ui-motion': 'viewer' }, outsider: { 'gameplay-feel': 'lead' } } as const;
    for (const [label, teams] of Object.entries(who)) {
      const email = uniqueEmail(`inbox-${label}`);
      await createPerson({ email, password: PASSWORD, name: `Inbox ${label}`, teams });
      people[label] = await signIn(t.app, email, PASSWORD);
    }
    ({ lead, animator, viewer, outsider } = people as Record<string, string>);
  });
  afterAll(async () => t?.close());

  const base = () => `/api/teams/${team}/packs/${PACK}`;
  const post = (cookie: string, url: string, body: object) => request(t.app).post(url).set('Cookie', cookie).set('Origin', ORIGIN).send(body);
  const inbox = async (cookie: string): Promise<InboxDto> => {
    const res = await request(t.app).get('/api/me/inbox').set('Cookie', cookie);
    expect(res.status).toBe(200);
    return res.body as InboxDto;
  };
  const of = (items: InboxItem[], n: number) => items.filter((i) => i.pack.slug === PACK && i.team.id === team && i.version === n);

  it('propose → the lead has a review to do, the animator sees it proposed, the outsider sees nothing', async () => {
    const v = (await proposeAndWait(t.app, animator, team, PACK, 'softer settle')).version.number;
    const forLead = of((await inbox(lead)).reviewsToDo, v);
    expect(forLead).toHaveLength(1);
    expect(forLead[0]).toMatchObject({ state: 'proposed', by: 'Inbox animator', path: `/packs/${PACK}/versions/${v}`, team: { id: team } });
    expect(Number.isNaN(Date.parse(forLead[0]!.at))).toBe(false);

    const mine = await inbox(animator);
    expect(of(mine.myProposals, v).map((i) => i.state)).toEqual(['proposed']);
    expect(of(mine.reviewsToDo, v)).toEqual([]); // animators do not review
    expect(of((await inbox(viewer)).reviewsToDo, v)).toEqual([]); // nor do viewers

    const other = await inbox(outsider);
    for (const list of [other.reviewsToDo, other.myProposals, other.recentReleases]) expect(list.filter((i) => i.team.id === team)).toEqual([]);
  });

  it('request changes, propose again, approve, release: states follow and the release is listed for the team only', async () => {
    const mine0 = (await inbox(animator)).myProposals.filter((i) => i.pack.slug === PACK);
    const v1 = mine0[0]!.version;
    expect((await post(lead, `${base()}/versions/${v1}/reviews`, { decision: 'request-changes', comment: 'the settle overshoots' })).status).toBe(201);
    expect(of((await inbox(animator)).myProposals, v1)).toMatchObject([{ state: 'changes-requested', by: 'Inbox lead' }]);
    expect(of((await inbox(lead)).reviewsToDo, v1)).toEqual([]); // reviewed: no longer waiting

    const v2 = (await proposeAndWait(t.app, animator, team, PACK, 'settle fixed')).version.number;
    expect(of((await inbox(lead)).reviewsToDo, v2)).toHaveLength(1);
    expect((await post(lead, `${base()}/versions/${v2}/reviews`, { decision: 'approve', comment: '' })).status).toBe(201);
    const mine = (await inbox(animator)).myProposals.filter((i) => i.pack.slug === PACK && [v1, v2].includes(i.version));
    // newest first: v2 approved after v1's changes were requested
    expect(mine.map((i) => [i.version, i.state])).toEqual([[v2, 'approved'], [v1, 'changes-requested']]);
    expect(of((await inbox(lead)).reviewsToDo, v2)).toEqual([]);

    const rel = await request(t.app).put(`${base()}/channels/shipping`).set('Cookie', lead).set('Origin', ORIGIN).send({ version: v2 });
    expect(rel.status).toBe(200);
    for (const cookie of [lead, animator, viewer]) {
      const releases = of((await inbox(cookie)).recentReleases, v2);
      expect(releases).toMatchObject([{ channel: 'shipping', by: 'Inbox lead', path: `/packs/${PACK}/versions/${v2}` }]);
    }
    const other = await inbox(outsider);
    for (const list of [other.reviewsToDo, other.myProposals, other.recentReleases]) expect(list.filter((i) => i.team.id === team)).toEqual([]);
  });

  it('anonymous callers get 401', async () => {
    expect((await request(t.app).get('/api/me/inbox')).status).toBe(401);
  });
});
