import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail, waitForMail } from '../support/accounts';
import { proposeAndWait } from '../support/bakes';
import type { CurveDocument, Key, Segment } from '../../shared/curve';
import type { CurveDto } from '../../shared/schemas/packs';
import type { VersionComparison, VersionDto } from '../../shared/schemas/versions';

const PASSWORD = 'reviews password 1';

const key = (time: number, value: number, slope = 0): Key => ({ time, value, slopeIn: slope, slopeOut: slope, rule: 'manual', slopes: 'joined' });
const doc = (name: string, keys: Key[], kind: Segment['kind']): CurveDocument => ({
  format: 'tangentry.curve', version: 1, name, units: { time: 's', value: 'progress' }, before: 'clamp', after: 'clamp', frameRate: 60,
  drives: 'position', tags: [], keys, segments: keys.slice(1).map(() => ({ kind })),
});

describe('review: compare versions, approve or request changes', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let team = '';
  let animator = '';
  let lead = '';
  let base = '';
  let animatorEmail = '';

  beforeAll(async () => {
    t = await testApp({ label: 'reviews', seed: true });
    team = await teamId('ui-motion');
    const cookies: string[] = [];
    for (const role of ['animator', 'lead'] as const) {
      const email = uniqueEmail(`reviews-${role}`);
      if (role === 'animator') animatorEmail = email;
      await createPerson({ email, password: PASSWORD, teams: { 'ui-motion': role } });
      cookies.push(await signIn(t.app, email, PASSWORD));
    }
    [animator, lead] = cookies as [string, string];
    base = `/api/teams/${team}/packs/review-test`;
  });
  afterAll(async () => t?.close());

  const post = (cookie: string, url: string, body: object) => request(t.app).post(url).set('Cookie', cookie).set('Origin', ORIGIN).send(body);
  const put = (cookie: string, url: string, body: object) => request(t.app).put(url).set('Cookie', cookie).set('Origin', ORIGIN).send(body);

  it('compares v2 with v1: added, removed, changed with the max deviation and where, per-target bytes', async () => {
    expect((await post(animator, `/api/teams/${team}/packs`, { name: 'Review test' })).status).toBe(201);
    const add = async (d: CurveDocument) => (await post(animator, `${base}/curves`, { document: d })).body.curve as CurveDto;
    const ramp = await add(doc('ramp', [key(0, 0), key(1, 1), key(2, 0)], 'linear'));
    const lift = await add(doc('lift', [key(0, 0, 1), key(0.5, 0.8, 0.5), key(1, 1)], 'hermite'));
    await add(doc('steady', [key(0, 0.5), key(1, 0.5)], 'linear'));
    const gone = await add(doc('gone', [key(0, 0), key(1, 1)], 'step'));
    expect((await proposeAndWait(t.app, animator, team, 'review-test', 'first')).bake.state).toBe('done');

    // v2: ramp's middle key 1 → 1.25; lift raised by 0.1 everywhere; gone removed; fresh added
    expect((await put(animator, `${base}/curves/${ramp.id}`, { document: doc('ramp', [key(0, 0), key(1, 1.25), key(2, 0)], 'linear'), revision: 1 })).status).toBe(200);
    expect((await put(animator, `${base}/curves/${lift.id}`, { document: doc('lift', [key(0, 0.1, 1), key(0.5, 0.9, 0.5), key(1, 1.1)], 'hermite'), revision: 1 })).status).toBe(200);
    expect((await request(t.app).delete(`${base}/curves/${gone.id}`).set('Cookie', animator).set('Origin', ORIGIN)).status).toBe(204);
    await add(doc('fresh', [key(0, 1), key(1, 0)], 'linear'));
    expect((await proposeAndWait(t.app, animator, team, 'review-test', 'second')).version.number).toBe(2);

    const res = await request(t.app).get(`${base}/versions/2/compare`).set('Cookie', lead);
    expect(res.status).toBe(200);
    const c: VersionComparison = res.body.comparison;
    expect(c).toMatchObject({ from: 1, to: 2, added: ['fresh'], removed: ['gone'], unchanged: ['steady'] });
    const byName = Object.fromEntries(c.changed.map((x) => [x.name, x]));
    // exact by construction: the difference of two piecewise-linear curves on the same knots is piecewise
    // linear, so it peaks at a knot: |1.25 − 1| = 0.25 at t = 1
    expect(byName.ramp!.maxDeviation).toBeCloseTo(0.25, 12);
    expect(byName.ramp!.at).toBe(1);
    // a Hermite curve with every value + 0.1 and the same slopes differs by exactly 0.1 everywhere
    // (the Hermite basis h00 + h01 = 1 reproduces constants)
    expect(byName.lift!.maxDeviation).toBeCloseTo(0.1, 12);
    expect(c.targets.map((x) => x.profile)).toEqual(['Console', 'Handheld', 'Mobile', 'Web']);
    for (const x of c.targets) expect(x.bytesBefore! > 0 && x.bytesAfter! > 0).toBe(true);

    const against = await request(t.app).get(`${base}/versions/1/compare`).set('Cookie', lead);
    expect(against.status).toBe(400);
    expect(against.body.error.fields.against).toMatch(/^against:/);
    const reverse = await request(t.app).get(`${base}/versions/1/compare?against=2`).set('Cookie', lead);
    expect(reverse.body.comparison).toMatchObject({ from: 2, to: 1, added: ['gone'], removed: ['fresh'] });
  });

  it('a lead requests changes (a comment is required), then approves; every review is kept', async () => {
    const url = `${base}/versions/2/reviews`;
    const silent = await post(lead, url, { decision: 'request-changes' });
    expect(silent.status).toBe(400);
    expect(silent.body.error.fields.comment).toMatch(/^comment:/);
    const bad = await post(lead, url, { decision: 'maybe' });
    expect(bad.body.error.fields.decision).toMatch(/^decision:/);
    expect((await post(animator, url, { decision: 'approve' })).status).toBe(403);

    const asked = await post(lead, url, { decision: 'request-changes', comment: 'The ramp peak is too high.' });
    expect(asked.status).toBe(201);
    expect((asked.body.version as VersionDto).state).toBe('changes-requested');
    const ok = await post(lead, url, { decision: 'approve', comment: '' });
    const v: VersionDto = ok.body.version;
    expect(v.state).toBe('approved');
    expect(v.reviews.map((r) => [r.decision, r.comment])).toEqual([['request-changes', 'The ramp peak is too high.'], ['approve', '']]);
    expect(v.reviews[0]!.reviewer).not.toBeNull();
    // the proposer is told, through the real mail catcher
    const asks = await waitForMail(animatorEmail, /asked for changes to v2 of review-test/);
    expect(asks.text).toContain('Comment: The ramp peak is too high.');
    expect(asks.text).toContain('/packs/review-test/versions/2');
    await waitForMail(animatorEmail, /approved v2 of review-test/);
    expect((await request(t.app).get(`${base}/versions/2`).set('Cookie', animator)).body.version.state).toBe('approved');
    expect((await post(lead, `${base}/versions/9/reviews`, { decision: 'approve' })).status).toBe(404);
  });
});
