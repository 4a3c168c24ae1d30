import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail } from '../support/accounts';
import { createToken } from '../../server/tokens/tokens.service';
import { DEMO_PACKS } from '../../server/seed/demo-packs';
import type { CurveDocument } from '../../shared/curve';
import type { CurveDto } from '../../shared/schemas/packs';

const PASSWORD = 'packs password 1';

const doc = (name: string, v1 = 1): CurveDocument => ({
  format: 'tangentry.curve', version: 1, name, units: { time: 's', value: 'progress' }, before: 'clamp', after: 'clamp',
  frameRate: 60, drives: 'position', tags: ['test'],
  keys: [
    { time: 0, value: 0, slopeIn: 0, slopeOut: 0, rule: 'manual', slopes: 'joined' },
    { time: 1, value: v1, slopeIn: 0, slopeOut: 0, rule: 'manual', slopes: 'joined' },
  ],
  segments: [{ kind: 'hermite' }],
});

describe('packs and curves API', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let team = '';
  let animator = '';
  let otherAnimator = '';
  let viewer = '';
  let adminId = '';

  beforeAll(async () => {
    t = await testApp({ label: 'packs', seed: true });
    team = await teamId('ui-motion');
    const roles = ['animator', 'animator', 'viewer', 'admin'] as const;
    const cookies: string[] = [];
    for (const [i, role] of roles.entries()) {
      const email = uniqueEmail(`packs-${role}-${i}`);
      const id = await createPerson({ email, password: PASSWORD, teams: { 'ui-motion': role } });
      if (role === 'admin') adminId = id;
      cookies.push(await signIn(t.app, email, PASSWORD));
    }
    [animator, otherAnimator, viewer] = cookies as [string, string, string];
  });
  afterAll(async () => t?.close());

  const as = (cookie: string) => ({
    get: (url: string) => request(t.app).get(url).set('Cookie', cookie),
    post: (url: string, body: object) => request(t.app).post(url).set('Cookie', cookie).set('Origin', ORIGIN).send(body),
    put: (url: string, body: object) => request(t.app).put(url).set('Cookie', cookie).set('Origin', ORIGIN).send(body),
    patch: (url: string, body: object) => request(t.app).patch(url).set('Cookie', cookie).set('Origin', ORIGIN).send(body),
    del: (url: string) => request(t.app).delete(url).set('Cookie', cookie).set('Origin', ORIGIN),
  });
  const packs = () => `/api/teams/${team}/packs`;

  it('the demo seed gives UI Motion its packs with their curves in order', async () => {
    const res = await as(viewer).get(packs());
    expect(res.status).toBe(200);
    const slugs = res.body.packs.map((p: { slug: string }) => p.slug);
    expect(slugs).toEqual(expect.arrayContaining(['menu-transitions', 'audio-fades']));
    expect(slugs).not.toContain('jump-arcs'); // Gameplay Feel's
    const menu = await as(viewer).get(`${packs()}/menu-transitions`);
    expect(menu.body.curves.map((c: CurveDto) => c.name)).toEqual(DEMO_PACKS.find((p) => p.slug === 'menu-transitions')!.curves.map((c) => c.name));
    expect(menu.body.pack.curveCount).toBe(menu.body.curves.length);
  });

  it('an animator creates, renames and archives a pack; the slug is derived and unique', async () => {
    const created = await as(animator).post(packs(), { name: 'Loading screens', tags: ['ui', 'loading'], frameRate: 30 });
    expect(created.status).toBe(201);
    expect(created.body.pack).toMatchObject({ slug: 'loading-screens', frameRate: 30, tags: ['ui', 'loading'], archived: false, curveCount: 0 });
    const again = await as(animator).post(packs(), { name: 'Loading Screens' });
    expect(again.status).toBe(409);
    expect(again.body.error.fields.slug).toMatch(/loading-screens/);
    const renamed = await as(animator).patch(`${packs()}/loading-screens`, { name: 'Loading and splash screens' });
    expect(renamed.body.pack).toMatchObject({ name: 'Loading and splash screens', slug: 'loading-screens' });
    const archived = await as(animator).patch(`${packs()}/loading-screens`, { archived: true });
    expect(archived.body.pack.archived).toBe(true);
    const add = await as(animator).post(`${packs()}/loading-screens/curves`, { document: doc('spinner') });
    expect(add.status).toBe(409);
    expect(add.body.error.code).toBe('pack_archived');
  });

  it('bad pack input names the field and stores nothing', async () => {
    const before = (await as(animator).get(packs())).body.packs.length;
    const res = await as(animator).post(packs(), { name: '', slug: 'Bad Slug', frameRate: -1, tags: ['ok', 'Not OK!'] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.name).toMatch(/^name:/);
    expect(res.body.error.fields.slug).toMatch(/^slug:/);
    expect(res.body.error.fields.frameRate).toMatch(/^frameRate:/);
    expect(res.body.error.fields['tags[1]']).toMatch(/^tags:/);
    expect((await as(animator).get(packs())).body.packs.length).toBe(before);
  });

  it('a bad curve document names the document path and stores nothing', async () => {
    const url = `${packs()}/menu-transitions/curves`;
    const before = (await as(animator).get(url)).body.curves.length;
    const early = doc('broken');
    early.keys[1]!.time = -1;
    const res = await as(animator).post(url, { document: early });
    expect(res.status).toBe(400);
    expect(res.body.error.fields['document.keys[1].time']).toMatch(/^document\.keys\[1\]\.time:/);
    const kind = doc('broken');
    (kind.segments[0] as { kind: string }).kind = 'cubic';
    const res2 = await as(animator).post(url, { document: kind });
    expect(res2.status).toBe(400);
    expect(res2.body.error.fields['document.segments[0].kind']).toMatch(/^document\.segments\[0\]\.kind: kind must be one of/);
    expect((await as(animator).get(url)).body.curves.length).toBe(before);
  });

  it('create, get, replace with the expected revision, and a revision conflict', async () => {
    const url = `${packs()}/menu-transitions/curves`;
    const created = await as(animator).post(url, { document: doc('slider-knob') });
    expect(created.status).toBe(201);
    const c: CurveDto = created.body.curve;
    expect(c.revision).toBe(1);
    expect((await as(viewer).get(`${url}/${c.id}`)).body.curve.document).toEqual(doc('slider-knob'));
    const first = await as(animator).put(`${url}/${c.id}`, { document: doc('slider-knob', 0.5), revision: 1 });
    expect(first.status).toBe(200);
    expect(first.body.curve.revision).toBe(2);
    const stale = await as(otherAnimator).put(`${url}/${c.id}`, { document: doc('slider-knob', 2), revision: 1 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('revision_conflict');
    expect(stale.body.error.fields.revision).toMatch(/revision/);
    const now = (await as(viewer).get(`${url}/${c.id}`)).body.curve;
    expect(now.revision).toBe(2);
    expect(now.document.keys[1].value).toBe(0.5);
    const dup = await as(animator).post(url, { document: doc('slider-knob') });
    expect(dup.status).toBe(409);
    expect(dup.body.error.fields['document.name']).toMatch(/slider-knob/);
    expect((await as(animator).del(`${url}/${c.id}`)).status).toBe(204);
    expect((await as(viewer).get(`${url}/${c.id}`)).status).toBe(404);
  });

  it('reorder takes every curve once; a partial list is refused and changes nothing', async () => {
    const url = `${packs()}/audio-fades`;
    const ids: string[] = (await as(viewer).get(url)).body.curves.map((c: CurveDto) => c.id);
    const partial = await as(animator).post(`${url}/reorder`, { curveIds: ids.slice(1) });
    expect(partial.status).toBe(400);
    expect(partial.body.error.fields.curveIds).toMatch(/exactly once/);
    expect((await as(viewer).get(url)).body.curves.map((c: CurveDto) => c.id)).toEqual(ids);
    const reversed = [...ids].reverse();
    const res = await as(animator).post(`${url}/reorder`, { curveIds: reversed });
    expect(res.status).toBe(200);
    expect((await as(viewer).get(url)).body.curves.map((c: CurveDto) => c.id)).toEqual(reversed);
  });

  it('move a curve to another pack and copy it back', async () => {
    await as(animator).post(packs(), { name: 'Scratch pack' });
    const created = (await as(animator).post(`${packs()}/menu-transitions/curves`, { document: doc('wobble') })).body.curve as CurveDto;
    const moved = await as(animator).post(`${packs()}/menu-transitions/curves/${created.id}/move`, { toPack: 'scratch-pack' });
    expect(moved.status).toBe(200);
    expect((await as(viewer).get(`${packs()}/menu-transitions/curves/${created.id}`)).status).toBe(404);
    expect((await as(viewer).get(`${packs()}/scratch-pack/curves/${created.id}`)).body.curve.name).toBe('wobble');
    const copied = await as(animator).post(`${packs()}/scratch-pack/curves/${created.id}/copy`, { toPack: 'menu-transitions' });
    expect(copied.status).toBe(201);
    expect(copied.body.curve).toMatchObject({ name: 'wobble', revision: 1 });
    expect(copied.body.curve.id).not.toBe(created.id);
    const sameName = await as(animator).post(`${packs()}/scratch-pack/curves/${created.id}/copy`, { toPack: 'scratch-pack' });
    expect(sameName.status).toBe(409);
    const renamedCopy = await as(animator).post(`${packs()}/scratch-pack/curves/${created.id}/copy`, { toPack: 'scratch-pack', name: 'wobble-2' });
    expect(renamedCopy.body.curve.document.name).toBe('wobble-2');
    const nowhere = await as(animator).post(`${packs()}/scratch-pack/curves/${created.id}/move`, { toPack: 'no-such-pack' });
    expect(nowhere.status).toBe(400);
    expect(nowhere.body.error.fields.toPack).toMatch(/no-such-pack/);
  });

  it('a viewer reads but cannot write', async () => {
    expect((await as(viewer).post(packs(), { name: 'Nope' })).status).toBe(403);
  });

  it('a service token limited to one pack sees only that pack', async () => {
    const { secret } = await createToken(team, { name: 'menus only', packSlugs: ['menu-transitions'] }, adminId);
    const bearer = (url: string) => request(t.app).get(url).set('Authorization', `Bearer ${secret}`);
    const list = await bearer(packs());
    expect(list.body.packs.map((p: { slug: string }) => p.slug)).toEqual(['menu-transitions']);
    expect((await bearer(`${packs()}/menu-transitions`)).status).toBe(200);
    expect((await bearer(`${packs()}/audio-fades`)).status).toBe(404);
    expect((await bearer(`${packs()}/audio-fades/curves`)).status).toBe(404);
  });
});
