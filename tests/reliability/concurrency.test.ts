/**
 * Concurrency over the real app and PostgreSQL, requests sent at once with Promise.all:
 *   - two people save one curve with the same revision → exactly one 200 and one 409
 *     revision_conflict; the stored document is the winner's and the revision went up once;
 *   - two leads move one channel at once (a new channel, then an existing one) → every move answered
 *     200 is recorded exactly once, the history is a chain (each move's `from` is the previous move's
 *     `to`) and the channel points at the last move's `to`;
 *   - two proposals of one pack at once → two distinct version numbers, n+1 and n+2 (whether the bake
 *     runs in the request or in the background: tests/reliability/support/proposals.ts follows both).
 * Each case runs several rounds, because a race that is lost once may be won the next time.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { randomBytes } from 'node:crypto';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail } from '../support/accounts';
import { DEMO_PACKS } from '../../server/seed/demo-packs';
import { createCurve, createPack } from '../../server/packs/packs.service';
import { proposeAndWait } from './support/proposals';

const PASSWORD = 'concurrency password 1';
const ROUNDS = 5;

describe('concurrency', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let team = '';
  let alice = '';
  let bob = '';

  beforeAll(async () => {
    t = await testApp({ label: 'concurrency', seed: true, env: { AUTH_RATE_LIMIT: '100000' } });
    team = await teamId('ui-motion');
    const a = uniqueEmail('conc-lead-a');
    const b = uniqueEmail('conc-lead-b');
    await createPerson({ email: a, password: PASSWORD, name: 'Lead A', teams: { 'ui-motion': 'lead' } });
    await createPerson({ email: b, password: PASSWORD, name: 'Lead B', teams: { 'ui-motion': 'lead' } });
    alice = await signIn(t.app, a, PASSWORD);
    bob = await signIn(t.app, b, PASSWORD);
  }, 60_000);
  afterAll(async () => t?.close());

  const doc = (name: string, description: string) => ({ ...structuredClone(DEMO_PACKS[0]!.curves[0]!), name, description });
  async function pack(curves = 1) {
    const p = await createPack(team, { name: `Conc ${randomBytes(4).toString('hex')}`, description: '', frameRate: 60, tags: [] });
    const ids: string[] = [];
    for (let i = 0; i < curves; i++) ids.push((await createCurve({ kind: 'anonymous' }, team, p.slug, doc(`curve-${i}`, 'first'))).id);
    return { slug: p.slug, ids, url: `/api/teams/${team}/packs/${p.slug}` };
  }
  const put = (cookie: string, url: string, body: object) => request(t.app).put(url).set('Origin', ORIGIN).set('Cookie', cookie).send(body);
  const post = (cookie: string, url: string, body: object) => request(t.app).post(url).set('Origin', ORIGIN).set('Cookie', cookie).send(body);

  it('two saves of one curve with the same revision: one 200, one 409 revision_conflict, no lost update', async () => {
    const p = await pack();
    const url = `${p.url}/curves/${p.ids[0]}`;
    let revision = 1;
    for (let round = 0; round < ROUNDS; round++) {
      const [ra, rb] = await Promise.all([
        put(alice, url, { document: doc('curve-0', `alice ${round}`), revision }),
        put(bob, url, { document: doc('curve-0', `bob ${round}`), revision }),
      ]);
      const statuses = [ra.status, rb.status].sort();
      expect(statuses, JSON.stringify([ra.body, rb.body])).toEqual([200, 409]);
      const [winner, loser, winnerName] = ra.status === 200 ? [ra, rb, 'alice'] : [rb, ra, 'bob'];
      expect(loser.body.error.code).toBe('revision_conflict');
      expect(loser.body.error.fields.revision).toMatch(/out of date/);
      expect(winner.body.curve.revision).toBe(revision + 1);
      const stored = await request(t.app).get(url).set('Cookie', alice);
      expect(stored.body.curve.revision).toBe(revision + 1);
      expect(stored.body.curve.document.description).toBe(`${winnerName} ${round}`);
      // the loser reloads and saves on top: nothing of the winner's is lost, the revision goes up once more
      revision += 1;
      const retry = await put(ra.status === 200 ? bob : alice, url, { document: doc('curve-0', `${winnerName === 'alice' ? 'bob' : 'alice'} again ${round}`), revision });
      expect(retry.status).toBe(200);
      revision += 1;
      expect(retry.body.curve.revision).toBe(revision);
    }
  }, 60_000);

  it('two leads move one channel at once: each move recorded once, the history a chain, the channel at the last move', async () => {
    const p = await pack();
    // four approved versions to move between
    const numbers: number[] = [];
    for (let i = 0; i < 4; i++) {
      const v = await proposeAndWait(t.app, alice, p.url, `conc channel ${i}`);
      expect(v.number, JSON.stringify(v.body)).not.toBeNull();
      numbers.push(v.number!);
      const r = await post(alice, `${p.url}/versions/${v.number}/reviews`, { decision: 'approve' });
      expect(r.status).toBe(201);
    }
    let okMoves = 0;
    for (let round = 0; round < ROUNDS; round++) {
      // round 0 creates the channel (both see no row); later rounds move an existing one
      const [x, y] = round % 2 === 0 ? [numbers[0]!, numbers[1]!] : [numbers[2]!, numbers[3]!];
      const channelUrl = `${p.url}/channels/shipping`;
      const [ra, rb] = await Promise.all([put(alice, channelUrl, { version: x }), put(bob, channelUrl, { version: y })]);
      for (const r of [ra, rb]) expect(r.status, JSON.stringify(r.body)).toBeLessThan(500);
      // a release either happens (200) or is refused with a conflict telling the lead to reload
      for (const r of [ra, rb]) expect([200, 409], JSON.stringify(r.body)).toContain(r.status);
      okMoves += [ra, rb].filter((r) => r.status === 200).length;
      const list = await request(t.app).get(`${p.url}/channels`).set('Cookie', alice);
      const ch = (list.body.channels as { name: string; version: number; history: { from: number | null; to: number }[] }[]).find((c) => c.name === 'shipping')!;
      expect(ch).toBeDefined();
      const history = [...ch.history].reverse(); // oldest first
      expect(ch.version).toBe(history[history.length - 1]!.to);
      expect(history[0]!.from).toBeNull();
      for (let i = 1; i < history.length; i++) {
        expect(history[i]!.from, `move ${i} of ${JSON.stringify(history)}`).toBe(history[i - 1]!.to);
        expect(history[i]!.to).not.toBe(history[i]!.from);
      }
      // a 200 whose target is where the channel already pointed records nothing, so moves ≤ 200s
      expect(history.length).toBeLessThanOrEqual(okMoves);
      expect(history.length).toBeGreaterThanOrEqual(round + 1);
    }
  }, 120_000);

  it('two proposals of one pack at once: distinct version numbers n+1 and n+2', async () => {
    const p = await pack(2);
    for (let round = 0; round < 3; round++) {
      const [a, b] = await Promise.all([proposeAndWait(t.app, alice, p.url, `conc a ${round}`), proposeAndWait(t.app, bob, p.url, `conc b ${round}`)]);
      expect(a.number, JSON.stringify(a.body)).not.toBeNull();
      expect(b.number, JSON.stringify(b.body)).not.toBeNull();
      expect(new Set([a.number, b.number]).size).toBe(2);
      expect([a.number!, b.number!].sort((m, n) => m - n)).toEqual([2 * round + 1, 2 * round + 2]);
    }
    const list = await request(t.app).get(`${p.url}/versions`).set('Cookie', alice);
    const got = (list.body.versions as { number: number }[]).map((v) => v.number).sort((m, n) => m - n);
    expect(got).toEqual([1, 2, 3, 4, 5, 6]);
  }, 120_000);
});
