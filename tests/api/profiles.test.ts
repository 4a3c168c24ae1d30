import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail } from '../support/accounts';
import { DEMO_PROFILES } from '../../shared/bake/profile';

const PASSWORD = 'profiles password 1';

describe('target profiles API', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let team = '';
  let engineer = '';
  let secondEngineer = '';
  let animator = '';

  beforeAll(async () => {
    t = await testApp({ label: 'profiles', seed: true });
    team = await teamId('ui-motion');
    const people = await Promise.all(
      (['engineer', 'engineer', 'animator'] as const).map(async (role, i) => {
        const email = uniqueEmail(`profiles-${role}-${i}`);
        await createPerson({ email, password: PASSWORD, teams: { 'ui-motion': role } });
        return signIn(t.app, email, PASSWORD);
      }),
    );
    [engineer, secondEngineer, animator] = people as [string, string, string];
  });
  afterAll(async () => t?.close());

  const as = (cookie: string) => ({
    get: (url: string) => request(t.app).get(url).set('Cookie', cookie),
    post: (url: string, body: object) => request(t.app).post(url).set('Cookie', cookie).set('Origin', ORIGIN).send(body),
    put: (url: string, body: object) => request(t.app).put(url).set('Cookie', cookie).set('Origin', ORIGIN).send(body),
    del: (url: string) => request(t.app).delete(url).set('Cookie', cookie).set('Origin', ORIGIN),
  });

  it('the demo seed gives every team the brief’s four targets in order', async () => {
    const res = await as(animator).get(`/api/teams/${team}/profiles`);
    expect(res.status).toBe(200);
    expect(res.body.profiles.map((p: { profile: { name: string } }) => p.profile.name)).toEqual(['Console', 'Handheld', 'Mobile', 'Web']);
    // BRIEF.md demo scenario: Console f32 hermite adaptive 5e-4 … Web CSS linear() 3e-3
    expect(res.body.profiles[0].profile).toEqual(DEMO_PROFILES[0]);
    expect(res.body.profiles[3].profile).toMatchObject({ output: 'css', kernel: 'linear', tolerance: { value: 3e-3 } });
  });

  it('an engineer creates a profile; defaults are filled in', async () => {
    const res = await as(engineer).post(`/api/teams/${team}/profiles`, {
      name: 'Handheld (tight)', tolerance: { mode: 'relative', value: 1e-3 }, kernel: 'hermite', layout: 'uniform', encoding: 'f16', byteCap: 4096,
    });
    expect(res.status).toBe(201);
    expect(res.body.profile.profile).toMatchObject({ name: 'Handheld (tight)', sampleCount: { rule: 'any' }, output: 'table', byteCap: 4096 });
    expect(res.body.profile.version).toBe(1);
  });

  it('bad input names the field and stores nothing', async () => {
    const before = (await as(engineer).get(`/api/teams/${team}/profiles`)).body.profiles.length;
    const res = await as(engineer).post(`/api/teams/${team}/profiles`, { name: 'Bad', tolerance: { mode: 'absolute', value: -1 }, kernel: 'cubic', layout: 'uniform', encoding: 'f32' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields['tolerance.value']).toMatch(/tolerance\.value/);
    expect(res.body.error.fields.kernel).toMatch(/kernel/);
    const css = await as(engineer).post(`/api/teams/${team}/profiles`, { name: 'Bad CSS', tolerance: { mode: 'absolute', value: 1e-3 }, kernel: 'hermite', layout: 'uniform', encoding: 'f32', output: 'css' });
    expect(css.status).toBe(400);
    expect(css.body.error.fields.kernel).toMatch(/linear/);
    expect((await as(engineer).get(`/api/teams/${team}/profiles`)).body.profiles.length).toBe(before);
  });

  it('names are unique per team', async () => {
    const res = await as(engineer).post(`/api/teams/${team}/profiles`, { ...DEMO_PROFILES[0] });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('name_taken');
    expect(res.body.error.fields.name).toMatch(/Console/);
  });

  it('two engineers editing one profile: one wins, the other gets a conflict, nothing is lost', async () => {
    const created = (await as(engineer).post(`/api/teams/${team}/profiles`, { ...DEMO_PROFILES[2], name: 'Mobile (race)' })).body.profile;
    const url = `/api/teams/${team}/profiles/${created.id}`;
    const first = await as(engineer).put(url, { profile: { ...created.profile, tolerance: { mode: 'absolute', value: 5e-3 } }, version: created.version });
    const second = await as(secondEngineer).put(url, { profile: { ...created.profile, encoding: 'unorm16' }, version: created.version });
    expect(first.status).toBe(200);
    expect(first.body.profile.version).toBe(2);
    expect(second.status).toBe(409);
    expect(second.body.error.code).toBe('version_conflict');
    const now = (await as(engineer).get(`/api/teams/${team}/profiles`)).body.profiles.find((p: { id: string }) => p.id === created.id);
    expect(now.profile.tolerance.value).toBe(5e-3);
    expect(now.profile.encoding).toBe('unorm8');
  });

  it('an animator can read but not edit', async () => {
    const res = await as(animator).post(`/api/teams/${team}/profiles`, { ...DEMO_PROFILES[0], name: 'Nope' });
    expect(res.status).toBe(403);
  });

  it('delete removes it; a second delete is 404', async () => {
    const created = (await as(engineer).post(`/api/teams/${team}/profiles`, { ...DEMO_PROFILES[1], name: 'Handheld (old)' })).body.profile;
    expect((await as(engineer).del(`/api/teams/${team}/profiles/${created.id}`)).status).toBe(204);
    expect((await as(engineer).del(`/api/teams/${team}/profiles/${created.id}`)).status).toBe(404);
  });
});
