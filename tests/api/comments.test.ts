import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { testApp } from '../support/app';
import { proposeAndWait } from '../support/bakes';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail } from '../support/accounts';
import type { CurveDocument, Key } from '../../shared/curve';
import type { CommentDto } from '../../shared/schemas/comments';
import type { ActivityPage } from '../../shared/schemas/activity';

const PASSWORD = 'comments password 1';
const key = (time: number, value: number): Key => ({ time, value, slopeIn: 0, slopeOut: 0, rule: 'manual', slopes: 'joined' });
const doc = (name: string, end: number): CurveDocument => ({
  format: 'tangentry.curve', version: 1, name, units: { time: 's', value: 'progress' }, before: 'clamp', after: 'clamp', frameRate: 60,
  drives: 'position', tags: [], keys: [key(0.25, 0), key(end, 1)], segments: [{ kind: 'linear' }],
});

describe('comments on a version: whole version, or pinned to a curve at a time', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let team = '';
  let animator = '';
  let lead = '';
  let viewer = '';
  let outsider = '';
  let url = '';

  beforeAll(async () => {
    t = await testApp({ label: 'comments', seed: true });
    team = await teamId('ui-motion');
    const cookie = async (role: 'animator' | 'lead' | 'viewer' | 'admin', teamSlug = 'ui-motion') => {
      const email = uniqueEmail(`comments-${role}`);
      await createPerson({ email, password: PASSWORD, name: `Comments ${role}`, teams: { [teamSlug]: role } });
      return signIn(t.app, email, PASSWORD);
    };
    animator = await cookie('animator');
    lead = await cookie('lead');
    viewer = await cookie('viewer');
    outsider = await cookie('admin', 'gameplay-feel');
    const base = `/api/teams/${team}/packs/comment-pack`;
    const post = (path: string, body: object) => request(t.app).post(path).set('Cookie', animator).set('Origin', ORIGIN).send(body);
    expect((await post(`/api/teams/${team}/packs`, { name: 'Comment pack' })).status).toBe(201);
    expect((await post(`${base}/curves`, { document: doc('dock-slide', 1.5) })).status).toBe(201);
    expect((await post(`${base}/curves`, { document: doc('fade', 0.75) })).status).toBe(201);
    expect((await proposeAndWait(t.app, animator, team, 'comment-pack', 'first')).version.number).toBe(1);
    url = `${base}/versions/1/comments`;
  });
  afterAll(async () => t?.close());

  const comment = (cookie: string, body: object) => request(t.app).post(url).set('Cookie', cookie).set('Origin', ORIGIN).send(body);
  const list = async () => (await request(t.app).get(url).set('Cookie', viewer)).body.comments as CommentDto[];

  it('stores an unpinned and a pinned comment, lists them oldest first, and tells the activity table', async () => {
    const whole = await comment(lead, { body: 'Looks calmer overall.' });
    expect(whole.status).toBe(201);
    expect(whole.body.comment).toMatchObject({ body: 'Looks calmer overall.', curve: null, time: null, author: { name: 'Comments lead' } });
    const pinned = await comment(animator, { body: 'The ease starts late here.', curve: 'dock-slide', time: 0.9 });
    expect(pinned.status).toBe(201);
    expect(pinned.body.comment).toMatchObject({ curve: 'dock-slide', time: 0.9, author: { name: 'Comments animator' } });
    // the domain's ends are inside it: [first key, last key]
    expect((await comment(lead, { body: 'At the very end.', curve: 'fade', time: 0.75 })).status).toBe(201);
    expect((await comment(viewer, { body: 'Whole curve.', curve: 'fade' })).status).toBe(201);
    const all = await list();
    expect(all.map((c) => [c.body, c.curve, c.time])).toEqual([
      ['Looks calmer overall.', null, null],
      ['The ease starts late here.', 'dock-slide', 0.9],
      ['At the very end.', 'fade', 0.75],
      ['Whole curve.', 'fade', null],
    ]);
    const activity = (await request(t.app).get(`/api/teams/${team}/activity?type=version.commented`).set('Cookie', lead)).body as ActivityPage;
    expect(activity.items.map((i) => `${i.actor?.name} ${i.words}`)).toContain('Comments animator commented on v1 of comment-pack at dock-slide, t = 0.9 s');
  });

  it('refuses a curve the version lacks, a time outside the curve’s domain, or a time without a curve: 400 naming the field, nothing stored', async () => {
    const before = (await list()).length;
    const cases: [object, string][] = [
      [{ body: 'x', curve: 'no-such-curve' }, 'curve'],
      [{ body: 'x', curve: 'fade', time: 0.76 }, 'time'],
      [{ body: 'x', curve: 'fade', time: 0.2 }, 'time'],
      [{ body: 'x', time: 0.5 }, 'time'],
      [{ body: 'x', curve: 'fade', time: 'soon' }, 'time'],
      [{ body: '   ' }, 'body'],
      [{ curve: 'fade' }, 'body'],
    ];
    for (const [body, field] of cases) {
      const res = await comment(lead, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.fields[field], JSON.stringify(body)).toMatch(new RegExp(`^${field}:`));
    }
    expect((await list()).length).toBe(before);
    const activity = (await request(t.app).get(`/api/teams/${team}/activity?type=version.commented&count=true`).set('Cookie', lead)).body as ActivityPage;
    expect(activity.total).toBe(4);
  });

  it('is for the team’s people: a version that does not exist is 404, another team’s member 404, anonymous 401', async () => {
    expect((await request(t.app).post(url.replace('/versions/1/', '/versions/7/')).set('Cookie', lead).set('Origin', ORIGIN).send({ body: 'x' })).status).toBe(404);
    expect((await comment(outsider, { body: 'x' })).status).toBe(404);
    expect((await request(t.app).get(url)).status).toBe(401);
  });
});
