// Service tokens: created by an admin, shown once, stored as a SHA-256 digest, read-only, revocable, last use recorded.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createHash } from 'node:crypto';
import { testApp } from '../support/app';
import { ORIGIN, signIn, teamId } from '../support/accounts';
import { DEMO_PASSWORD } from '../../server/seed/demo-accounts';

describe('service tokens', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let admin: string;
  let ui: string;
  let gf: string;
  beforeAll(async () => {
    t = await testApp({ label: 'tokens', seed: true, env: { TANGENTRY_EMBEDDED: 'true' } });
    admin = await signIn(t.app, 'admin@corvid-lantern.test', DEMO_PASSWORD);
    ui = await teamId('ui-motion');
    gf = await teamId('gameplay-feel');
  });
  afterAll(async () => t?.close());

  it('shows the secret once, keeps only its hash, authenticates as the token for reads of its team', async () => {
    const made = await request(t.app).post(`/api/teams/${ui}/tokens`).set('Origin', ORIGIN).set('Cookie', admin).send({ name: 'nightly build farm', packSlugs: ['menu-transitions', 'jump-arcs', 'jump-arcs'] });
    expect(made.status).toBe(201);
    const secret: string = made.body.secret;
    expect(secret).toMatch(/^tgt_[0-9a-f]{32}_[A-Za-z0-9_-]{43}$/);
    expect(made.body.token).toMatchObject({ name: 'nightly build farm', packSlugs: ['jump-arcs', 'menu-transitions'], lastUsedAt: null, revokedAt: null });

    const list = await request(t.app).get(`/api/teams/${ui}/tokens`).set('Cookie', admin);
    expect(JSON.stringify(list.body)).not.toContain(secret.slice(37));
    const [rows] = await t.ctx.sequelize.query('SELECT token_hash FROM service_tokens WHERE id = $1', { bind: [made.body.token.id] });
    expect((rows as { token_hash: string }[])[0]!.token_hash).toBe(createHash('sha256').update(secret.slice(37)).digest('hex'));

    const read = await request(t.app).get(`/api/teams/${ui}`).set('Authorization', `Bearer ${secret}`);
    expect(read.status).toBe(200);
    expect(read.body.team.name).toBe('UI Motion');
    const after = await request(t.app).get(`/api/teams/${ui}/tokens`).set('Cookie', admin);
    expect(after.body.tokens.find((x: { id: string }) => x.id === made.body.token.id).lastUsedAt).not.toBeNull();

    // read-only, one team only, never a person's routes
    expect((await request(t.app).post(`/api/teams/${ui}/tokens`).set('Authorization', `Bearer ${secret}`).send({ name: 'x' })).status).toBe(403);
    expect((await request(t.app).get(`/api/teams/${gf}`).set('Authorization', `Bearer ${secret}`)).status).toBe(404);
    expect((await request(t.app).get('/api/auth/me').set('Authorization', `Bearer ${secret}`)).status).toBe(403);

    // revoked: 401 at once
    expect((await request(t.app).delete(`/api/teams/${ui}/tokens/${made.body.token.id}`).set('Origin', ORIGIN).set('Cookie', admin)).status).toBe(204);
    const gone = await request(t.app).get(`/api/teams/${ui}`).set('Authorization', `Bearer ${secret}`);
    expect(gone.status).toBe(401);
    expect(gone.body.error.message).toMatch(/revoked/);
    expect((await request(t.app).delete(`/api/teams/${ui}/tokens/${made.body.token.id}`).set('Origin', ORIGIN).set('Cookie', admin)).status).toBe(404);
  });

  it('refuses a tampered or malformed bearer token with 401', async () => {
    const made = await request(t.app).post(`/api/teams/${ui}/tokens`).set('Origin', ORIGIN).set('Cookie', admin).send({ name: 'ci' });
    const s: string = made.body.secret;
    const tampered = s.slice(0, -1) + (s.endsWith('A') ? 'B' : 'A');
    expect((await request(t.app).get(`/api/teams/${ui}`).set('Authorization', `Bearer ${tampered}`)).status).toBe(401);
    expect((await request(t.app).get(`/api/teams/${ui}`).set('Authorization', 'Bearer nonsense')).status).toBe(401);
    expect((await request(t.app).get(`/api/teams/${ui}`).set('Authorization', 'Basic abc')).status).toBe(401);
  });

  it('validates the form with field messages', async () => {
    const res = await request(t.app).post(`/api/teams/${ui}/tokens`).set('Origin', ORIGIN).set('Cookie', admin).send({ name: '', packSlugs: ['Jump Arcs'] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.name).toMatch(/Name/);
    expect(res.body.error.fields['packSlugs[0]']).toMatch(/slug/);
  });
});
