import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { testApp } from '../support/app';
import { proposeAndWait } from '../support/bakes';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail, waitForMail } from '../support/accounts';
import type { CurveDocument, Key } from '../../shared/curve';
import type { NoticesDto } from '../../shared/schemas/notifications';

const PASSWORD = 'notices password 1';
const key = (time: number, value: number): Key => ({ time, value, slopeIn: 0, slopeOut: 0, rule: 'manual', slopes: 'joined' });
const doc = (name: string): CurveDocument => ({
  format: 'tangentry.curve', version: 1, name, units: { time: 's', value: 'progress' }, before: 'clamp', after: 'clamp', frameRate: 60,
  drives: 'position', tags: [], keys: [key(0, 0), key(1, 1)], segments: [{ kind: 'linear' }],
});

describe('in-app notices: reviews, comments and proposals reach the right person, who alone reads and marks them', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let team = '';
  let animator = '';
  let animatorEmail = '';
  let lead = '';
  let admin = '';
  let viewer = '';
  const base = () => `/api/teams/${team}/packs/notice-pack`;

  beforeAll(async () => {
    t = await testApp({ label: 'notices', seed: true });
    team = await teamId('ui-motion');
    const cookie = async (role: 'animator' | 'lead' | 'admin' | 'viewer') => {
      const email = uniqueEmail(`notices-${role}`);
      if (role === 'animator') animatorEmail = email;
      await createPerson({ email, password: PASSWORD, name: `Notices ${role}`, teams: { 'ui-motion': role } });
      return signIn(t.app, email, PASSWORD);
    };
    animator = await cookie('animator');
    lead = await cookie('lead');
    admin = await cookie('admin');
    viewer = await cookie('viewer');
  });
  afterAll(async () => t?.close());

  const post = (cookie: string, path: string, body: object) => request(t.app).post(path).set('Cookie', cookie).set('Origin', ORIGIN).send(body);
  const notices = async (cookie: string) => (await request(t.app).get('/api/me/notifications').set('Cookie', cookie)).body as NoticesDto;

  it('a proposal tells the leads and admins (not the proposer); an approval tells the proposer, by e-mail and in the app', async () => {
    expect((await post(animator, `/api/teams/${team}/packs`, { name: 'Notice pack' })).status).toBe(201);
    expect((await post(animator, `${base()}/curves`, { document: doc('glide') })).status).toBe(201);
    expect((await proposeAndWait(t.app, animator, team, 'notice-pack', 'first')).version.number).toBe(1);

    for (const reviewer of [lead, admin]) {
      const n = await notices(reviewer);
      expect(n.notices.map((x) => x.text)).toContain('Notices animator proposed v1 of notice-pack for review');
      expect(n.notices[0]).toMatchObject({ type: 'version.proposed', link: '/packs/notice-pack/versions/1', version: 1, pack: { slug: 'notice-pack' }, readAt: null, team: { id: team } });
    }
    expect((await notices(viewer)).notices).toEqual([]);
    expect((await notices(animator)).unread).toBe(0);

    expect((await post(lead, `${base()}/versions/1/reviews`, { decision: 'approve' })).status).toBe(201);
    const mine = await notices(animator);
    expect(mine.unread).toBe(1);
    expect(mine.notices).toHaveLength(1);
    expect(mine.notices[0]).toMatchObject({ type: 'version.approved', text: 'Notices lead approved v1 of notice-pack', link: '/packs/notice-pack/versions/1', readAt: null });
    // the e-mail is still sent (server/versions/review-mail.ts), through the real catcher
    await waitForMail(animatorEmail, /approved v1 of notice-pack/);
  });

  it('a comment by someone else tells the proposer; their own comment does not', async () => {
    expect((await post(lead, `${base()}/versions/1/comments`, { body: 'Nice glide.', curve: 'glide', time: 0.5 })).status).toBe(201);
    expect((await post(animator, `${base()}/versions/1/comments`, { body: 'Thanks!' })).status).toBe(201);
    const mine = await notices(animator);
    expect(mine.unread).toBe(2);
    expect(mine.notices[0]).toMatchObject({ type: 'version.commented', text: 'Notices lead commented on v1 of notice-pack at glide, t = 0.5 s: “Nice glide.”', link: '/packs/notice-pack/versions/1#comments' });
  });

  it('marks read by id or all; nobody else reads or marks them', async () => {
    const mine = await notices(animator);
    const [newest, older] = mine.notices as [NoticesDto['notices'][0], NoticesDto['notices'][0]];
    // the lead's list holds only the lead's own notices; marking the animator's ids changes nothing
    expect((await notices(lead)).notices.some((x) => x.id === newest.id || x.id === older.id)).toBe(false);
    const theirs = await post(lead, '/api/me/notifications/read', { ids: [newest.id, older.id] });
    expect(theirs.status).toBe(200);
    expect(theirs.body.marked).toBe(0);
    expect((await notices(animator)).unread).toBe(2);

    const one = await post(animator, '/api/me/notifications/read', { ids: [newest.id] });
    expect(one.body).toEqual({ marked: 1, unread: 1 });
    const after = await notices(animator);
    expect(after.notices.find((x) => x.id === newest.id)!.readAt).not.toBeNull();
    expect(after.notices.find((x) => x.id === older.id)!.readAt).toBeNull();
    expect((await post(animator, '/api/me/notifications/read', { all: true })).body).toEqual({ marked: 1, unread: 0 });

    for (const [body, field] of [[{}, 'ids'], [{ ids: ['not-a-uuid'] }, 'ids[0]'], [{ ids: [] }, 'ids'], [{ all: false }, 'all']] as const) {
      const res = await post(animator, '/api/me/notifications/read', body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(Object.keys(res.body.error.fields), JSON.stringify(body)).toContain(field);
    }
    expect((await request(t.app).get('/api/me/notifications')).status).toBe(401);
    expect((await request(t.app).post('/api/me/notifications/read').set('Origin', ORIGIN).send({ all: true })).status).toBe(401);
  });
});
