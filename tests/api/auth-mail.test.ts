// Invitations and password reset end to end through the real mail catcher (SMTP → its store on disk).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createHash } from 'node:crypto';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, linkIn, mailsTo, signIn, teamId, uniqueEmail, waitForMail } from '../support/accounts';
import { DEMO_PASSWORD } from '../../server/seed/demo-accounts';

type T = Awaited<ReturnType<typeof testApp>>;
const sha256 = (s: string) => createHash('sha256').update(s).digest('hex');
/** `<prefix>_<32 hex>_<secret>`; the base64url secret may itself contain underscores. */
const secretOf = (token: string) => token.split('_').slice(2).join('_');

describe('invitations by e-mail', () => {
  let t: T;
  let admin: string;
  let ui: string;
  beforeAll(async () => {
    t = await testApp({ label: 'invite', seed: true, env: { TANGENTRY_EMBEDDED: 'true' } });
    admin = await signIn(t.app, 'admin@corvid-lantern.test', DEMO_PASSWORD);
    ui = await teamId('ui-motion');
  });
  afterAll(async () => t?.close());

  it('admin invites; the person follows the mailed link, sets name and password, and is a member with that role', async () => {
    const email = uniqueEmail('invitee');
    const sent = await request(t.app).post(`/api/teams/${ui}/invitations`).set('Origin', ORIGIN).set('Cookie', admin).send({ email, role: 'engineer' });
    expect(sent.status).toBe(201);
    const message = await waitForMail(email, /invited to UI Motion/);
    expect(message.text).toMatch(/Wren Halloway invited you to the team "UI Motion" of Corvid Lantern Games as engineer/);
    const link = linkIn(message, '/invite');
    expect(link.origin).toBe(ORIGIN);
    const token = link.pathname.split('/').pop()!;

    // only a SHA-256 digest is stored, never the link's secret
    const [rows] = await t.ctx.sequelize.query('SELECT token_hash FROM invitations WHERE email = $1', { bind: [email] });
    const stored = (rows as { token_hash: string }[])[0]!.token_hash;
    expect(stored).toBe(sha256(secretOf(token)));
    expect(JSON.stringify(rows)).not.toContain(secretOf(token));

    const pending = await request(t.app).get(`/api/teams/${ui}/invitations`).set('Cookie', admin);
    expect(pending.body.invitations.map((i: { email: string }) => i.email)).toContain(email);

    const shown = await request(t.app).get(`/api/invitations/${token}`);
    expect(shown.status).toBe(200);
    expect(shown.body).toMatchObject({ email, role: 'engineer', teamName: 'UI Motion', accountExists: false });

    const weak = await request(t.app).post('/api/invitations/accept').set('Origin', ORIGIN).send({ token, name: 'Oriel Fenn', password: 'short' });
    expect(weak.status).toBe(400);
    expect(weak.body.error.fields.password).toMatch(/12 characters/);

    const accepted = await request(t.app).post('/api/invitations/accept').set('Origin', ORIGIN).send({ token, name: 'Oriel Fenn', password: 'a long new password' });
    expect(accepted.status).toBe(200);
    const me = await request(t.app).get('/api/auth/me').set('Cookie', String(accepted.headers['set-cookie']).split(';')[0]!);
    expect(me.body.user).toMatchObject({ email, name: 'Oriel Fenn' });
    expect(me.body.teams).toEqual([expect.objectContaining({ name: 'UI Motion', role: 'engineer' })]);

    // single use
    const again = await request(t.app).post('/api/invitations/accept').set('Origin', ORIGIN).send({ token, name: 'Oriel Fenn', password: 'a long new password' });
    expect(again.status).toBe(404);
    expect((await request(t.app).get(`/api/invitations/${token}`)).status).toBe(404);
  });

  it('someone with an account joins another team by confirming their password', async () => {
    const gf = await teamId('gameplay-feel');
    const sent = await request(t.app).post(`/api/teams/${gf}/invitations`).set('Origin', ORIGIN).set('Cookie', admin).send({ email: 'viewer@corvid-lantern.test', role: 'animator' });
    expect(sent.status).toBe(201);
    const token = linkIn(await waitForMail('viewer@corvid-lantern.test', /Gameplay Feel/), '/invite').pathname.split('/').pop()!;
    expect((await request(t.app).get(`/api/invitations/${token}`)).body.accountExists).toBe(true);
    const wrong = await request(t.app).post('/api/invitations/accept').set('Origin', ORIGIN).send({ token, password: 'not it' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.fields.password).toBeTruthy();
    const ok = await request(t.app).post('/api/invitations/accept').set('Origin', ORIGIN).send({ token, password: DEMO_PASSWORD });
    expect(ok.status).toBe(200);
    const me = await request(t.app).get('/api/auth/me').set('Cookie', await signIn(t.app, 'viewer@corvid-lantern.test', DEMO_PASSWORD));
    expect(Object.fromEntries(me.body.teams.map((x: { slug: string; role: string }) => [x.slug, x.role]))).toEqual({ 'ui-motion': 'viewer', 'gameplay-feel': 'animator' });
  });

  it('refuses to invite an existing member and withdrawn or expired links stop working', async () => {
    const dup = await request(t.app).post(`/api/teams/${ui}/invitations`).set('Origin', ORIGIN).set('Cookie', admin).send({ email: 'lead@corvid-lantern.test', role: 'viewer' });
    expect(dup.status).toBe(409);
    expect(dup.body.error.fields.email).toBeTruthy();

    const email = uniqueEmail('withdrawn');
    const sent = await request(t.app).post(`/api/teams/${ui}/invitations`).set('Origin', ORIGIN).set('Cookie', admin).send({ email, role: 'viewer' });
    const token = linkIn(await waitForMail(email, /invited/), '/invite').pathname.split('/').pop()!;
    expect((await request(t.app).delete(`/api/teams/${ui}/invitations/${sent.body.invitation.id}`).set('Origin', ORIGIN).set('Cookie', admin)).status).toBe(204);
    expect((await request(t.app).get(`/api/invitations/${token}`)).status).toBe(404);

    const email2 = uniqueEmail('expired');
    await request(t.app).post(`/api/teams/${ui}/invitations`).set('Origin', ORIGIN).set('Cookie', admin).send({ email: email2, role: 'viewer' });
    const token2 = linkIn(await waitForMail(email2, /invited/), '/invite').pathname.split('/').pop()!;
    await t.ctx.sequelize.query(`UPDATE invitations SET expires_at = now() - interval '1 second' WHERE email = $1`, { bind: [email2] });
    const late = await request(t.app).post('/api/invitations/accept').set('Origin', ORIGIN).send({ token: token2, name: 'Late Comer', password: 'a long new password' });
    expect(late.status).toBe(404);
    const [rows] = await t.ctx.sequelize.query('SELECT count(*)::int AS n FROM auth_user WHERE email = $1', { bind: [email2] });
    expect((rows as { n: number }[])[0]!.n).toBe(0);
  });

  it('the outbox lists caught messages with their links, for admins only', async () => {
    const res = await request(t.app).get('/api/outbox').set('Cookie', admin);
    expect(res.status).toBe(200);
    const m = res.body.messages.find((x: { subject: string }) => /invited to/.test(x.subject));
    expect(m.links[0]).toMatch(/\/invite\/inv_/);
    const lead = await signIn(t.app, 'lead@corvid-lantern.test', DEMO_PASSWORD);
    expect((await request(t.app).get('/api/outbox').set('Cookie', lead)).status).toBe(403);
  });
});

describe('password reset by e-mail', () => {
  let t: T;
  beforeAll(async () => {
    t = await testApp({ label: 'reset', seed: true });
  });
  afterAll(async () => t?.close());

  it('mails a single-use link; the new password works, the old one and every session stop working', async () => {
    const email = uniqueEmail('forgetful');
    await createPerson({ email, password: 'the old password', teams: { 'ui-motion': 'animator' } });
    const before = await signIn(t.app, email, 'the old password');
    const asked = await request(t.app).post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email: email.toUpperCase() });
    expect(asked.status).toBe(202);
    const link = linkIn(await waitForMail(email, /Reset your Tangentry password/), '/reset-password');
    const token = link.pathname.split('/').pop()!;
    const [rows] = await t.ctx.sequelize.query('SELECT token_hash FROM password_resets');
    expect((rows as { token_hash: string }[]).map((r) => r.token_hash)).toContain(sha256(secretOf(token)));

    const done = await request(t.app).post('/api/auth/password-reset/complete').set('Origin', ORIGIN).send({ token, password: 'the brand new password' });
    expect(done.status).toBe(204);
    expect((await request(t.app).get('/api/auth/me').set('Cookie', before)).status).toBe(401);
    await expect(signIn(t.app, email, 'the old password')).rejects.toThrow(/401/);
    await signIn(t.app, email, 'the brand new password');

    const twice = await request(t.app).post('/api/auth/password-reset/complete').set('Origin', ORIGIN).send({ token, password: 'yet another password' });
    expect(twice.status).toBe(400);
    expect(twice.body.error.code).toBe('invalid_token');
    const tampered = await request(t.app).post('/api/auth/password-reset/complete').set('Origin', ORIGIN).send({ token: token.slice(0, -2) + 'AA', password: 'yet another password' });
    expect(tampered.status).toBe(400);
  });

  it('an expired link is refused', async () => {
    const email = uniqueEmail('slow');
    await createPerson({ email, password: 'the old password', teams: { 'ui-motion': 'viewer' } });
    await request(t.app).post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email });
    const token = linkIn(await waitForMail(email, /Reset/), '/reset-password').pathname.split('/').pop()!;
    await t.ctx.sequelize.query(`UPDATE password_resets SET expires_at = now() - interval '1 second'`);
    const res = await request(t.app).post('/api/auth/password-reset/complete').set('Origin', ORIGIN).send({ token, password: 'the brand new password' });
    expect(res.status).toBe(400);
    await signIn(t.app, email, 'the old password');
  });

  it('answers the same whether or not the address has an account, and mails nothing for an unknown one', async () => {
    const known = uniqueEmail('known');
    const unknown = uniqueEmail('unknown');
    await createPerson({ email: known, password: 'the old password', teams: { 'ui-motion': 'viewer' } });
    const a = await request(t.app).post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email: known });
    const b = await request(t.app).post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email: unknown });
    expect([a.status, b.status]).toEqual([202, 202]);
    expect(a.body).toEqual(b.body);
    await waitForMail(known, /Reset/);
    await new Promise((r) => setTimeout(r, 300));
    expect(mailsTo(unknown)).toEqual([]);
  });
});
