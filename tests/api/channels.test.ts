import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail } from '../support/accounts';
import { proposeAndWait } from '../support/bakes';
import { createToken } from '../../server/tokens/tokens.service';
import type { ChannelDto } from '../../shared/schemas/channels';

const PASSWORD = 'channels password 1';

describe('channels: release an approved version, keep every move, roll back', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let team = '';
  let lead = '';
  let animator = '';
  let adminId = '';

  beforeAll(async () => {
    t = await testApp({ label: 'channels', seed: true });
    team = await teamId('ui-motion');
    const cookies: string[] = [];
    for (const role of ['lead', 'animator', 'admin'] as const) {
      const email = uniqueEmail(`channels-${role}`);
      const id = await createPerson({ email, password: PASSWORD, teams: { 'ui-motion': role } });
      if (role === 'admin') adminId = id;
      cookies.push(await signIn(t.app, email, PASSWORD));
    }
    [lead, animator] = cookies as [string, string];
  });
  afterAll(async () => t?.close());

  const base = () => `/api/teams/${team}/packs/menu-transitions`;
  const post = (cookie: string, url: string, body: object) => request(t.app).post(url).set('Cookie', cookie).set('Origin', ORIGIN).send(body);
  const release = (cookie: string, channel: string, version: unknown) => request(t.app).put(`${base()}/channels/${channel}`).set('Cookie', cookie).set('Origin', ORIGIN).send({ version });

  it('only an approved version can be released; leads release, animators cannot', async () => {
    for (const c of ['v1', 'v2']) expect((await proposeAndWait(t.app, animator, team, 'menu-transitions', c)).version.number).toBe(Number(c.slice(1)));
    const refused = await release(lead, 'shipping', 1);
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('not_approved');
    for (const n of [1, 2]) expect((await post(lead, `${base()}/versions/${n}/reviews`, { decision: 'approve' })).status).toBe(201);
    expect((await release(animator, 'shipping', 1)).status).toBe(403);
    const bad = await release(lead, 'Shipping!', 1);
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.channel).toMatch(/^channel:/);
    const badVersion = await release(lead, 'shipping', 'one');
    expect(badVersion.body.error.fields.version).toMatch(/^version:/);
    expect((await release(lead, 'shipping', 7)).status).toBe(404);
    expect((await request(t.app).get(`${base()}/channels`).set('Cookie', lead)).body.channels).toEqual([]);
  });

  it('release v1, then v2, then roll back to v1: the pointer follows and every move is kept', async () => {
    expect((await release(lead, 'shipping', 1)).body.channel.version).toBe(1);
    expect((await release(lead, 'shipping', 2)).body.channel.version).toBe(2);
    const again = await release(lead, 'shipping', 2); // already there: nothing new recorded
    expect(again.body.channel.history.length).toBe(2);
    const back: ChannelDto = (await release(lead, 'shipping', 1)).body.channel;
    expect(back.version).toBe(1);
    expect(back.history.map((m) => [m.from, m.to])).toEqual([[2, 1], [1, 2], [null, 1]]);
    expect(back.history.every((m) => m.by !== null && !Number.isNaN(Date.parse(m.at)))).toBe(true);
    await release(lead, 'nightly', 2);
    const { secret } = await createToken(team, { name: 'build server' }, adminId);
    const list = await request(t.app).get(`${base()}/channels`).set('Authorization', `Bearer ${secret}`);
    expect(list.status).toBe(200);
    expect(list.body.channels.map((c: ChannelDto) => [c.name, c.version])).toEqual([['nightly', 2], ['shipping', 1]]);
  });
});
