/**
 * Webhooks end to end over the real app and PostgreSQL: a receiver HTTP server started here checks every
 * signature with its own createHmac call (HMAC-SHA256 per RFC 2104, over `${timestamp}.${body}` as
 * docs/webhooks.md documents), the dispatcher delivers with retries, and the API lists and redelivers.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createServer, type IncomingHttpHeaders, type Server } from 'node:http';
import { createHmac, timingSafeEqual } from 'node:crypto';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail } from '../support/accounts';
import { proposeAndWait } from '../support/bakes';
import { createContext, closeContext } from '../../server/context';
import { createWebhookDispatcher, type WebhookDispatcher } from '../../server/webhooks/dispatcher';
import { createWebhook } from '../../server/webhooks/webhooks.service';
import { insertDeliveries } from '../../server/webhooks/webhooks.repository';
import { HttpError } from '../../server/http/errors';
import type { DeliveryDto, WebhookDto } from '../../shared/schemas/webhooks';

const PASSWORD = 'webhooks password 1';

interface Received {
  path: string;
  headers: IncomingHttpHeaders;
  body: string;
  json: { id: string; type: string; team: { id: string; slug: string }; pack: { slug: string } | null; subject: { kind: string; label: string }; data: Record<string, unknown>; at: string };
}

/** The receiver: records every request; `/flaky-N` answers 500 to its first two requests, `/down` always 500, `/slow` waits 30 ms. */
function startReceiver(): Promise<{ server: Server; url: string; got: Received[] }> {
  const got: Received[] = [];
  const seen = new Map<string, number>();
  const server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      const body = Buffer.concat(chunks).toString('utf8');
      const path = req.url ?? '/';
      got.push({ path, headers: req.headers, body, json: JSON.parse(body) });
      const n = (seen.get(path) ?? 0) + 1;
      seen.set(path, n);
      const status = path.startsWith('/flaky') && n <= 2 ? 500 : path === '/down' ? 500 : 204;
      setTimeout(() => res.writeHead(status).end(), path === '/slow' ? 30 : 0);
    });
  });
  return new Promise((resolve) => server.listen(0, '127.0.0.1', () => {
    const a = server.address();
    resolve({ server, url: `http://127.0.0.1:${typeof a === 'object' && a ? a.port : 0}`, got });
  }));
}

/** The receiver's own check, independent of server/webhooks/signature.ts. */
function signatureValid(r: Received, secret: string): boolean {
  const ts = String(r.headers['tangentry-timestamp']);
  const given = Buffer.from(String(r.headers['tangentry-signature']), 'hex');
  const expected = createHmac('sha256', secret).update(`${ts}.${r.body}`).digest();
  const fresh = Math.abs(Date.now() / 1000 - Number(ts)) < 300;
  return fresh && given.length === 32 && timingSafeEqual(given, expected);
}

async function waitFor<T>(what: string, fn: () => T | undefined | false | Promise<T | undefined | false>, ms = 10_000): Promise<T> {
  const until = Date.now() + ms;
  for (;;) {
    const v = await fn();
    if (v) return v;
    if (Date.now() > until) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

describe('webhooks: register, receive signed events, retries, redeliver', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let receiver: Awaited<ReturnType<typeof startReceiver>>;
  let dispatcher: WebhookDispatcher;
  let team = '';
  let admin = '';
  let lead = '';
  let animator = '';
  let adminId = '';

  beforeAll(async () => {
    receiver = await startReceiver();
    t = await testApp({
      label: 'webhooks', seed: true,
      env: { WEBHOOK_ALLOW_PRIVATE_TARGETS: 'true', WEBHOOK_RETRY_SCHEDULE: '0.2,0.2,0.2', WEBHOOK_POLL_MS: '100', WEBHOOK_TIMEOUT_MS: '2000' },
    });
    dispatcher = createWebhookDispatcher(t.ctx);
    team = await teamId('ui-motion');
    const cookies: string[] = [];
    for (const role of ['admin', 'lead', 'animator'] as const) {
      const email = uniqueEmail(`webhooks-${role}`);
      const id = await createPerson({ email, password: PASSWORD, teams: { 'ui-motion': role } });
      if (role === 'admin') adminId = id;
      cookies.push(await signIn(t.app, email, PASSWORD));
    }
    [admin, lead, animator] = cookies as [string, string, string];
  });
  afterAll(async () => {
    await dispatcher?.stop();
    await t?.close();
    await new Promise((r) => receiver?.server.close(r));
  });

  const hooks = () => `/api/teams/${team}/webhooks`;
  const pack = () => `/api/teams/${team}/packs/menu-transitions`;
  const post = (cookie: string, url: string, body: object = {}) => request(t.app).post(url).set('Cookie', cookie).set('Origin', ORIGIN).send(body);
  const deliveries = async (id: string, q = ''): Promise<{ deliveries: DeliveryDto[]; total: number; page: number; perPage: number }> =>
    (await request(t.app).get(`${hooks()}/${id}/deliveries${q}`).set('Cookie', admin)).body;
  const register = async (path: string, events: string[]) => {
    const res = await post(admin, hooks(), { url: `${receiver.url}${path}`, events, description: `receiver ${path}` });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    return res.body as { webhook: WebhookDto; secret: string };
  };
  const at = (path: string) => receiver.got.filter((r) => r.path === path);

  let main: { webhook: WebhookDto; secret: string };

  it('an admin registers a webhook; the secret is shown once and never listed', async () => {
    main = await register('/main', ['version.proposed', 'version.approved', 'version.changes-requested', 'channel.moved']);
    expect(main.secret).toMatch(/^whsec_[A-Za-z0-9_-]{43}$/);
    expect(main.webhook.events).toEqual(['version.proposed', 'version.approved', 'version.changes-requested', 'channel.moved']);
    const list = await request(t.app).get(hooks()).set('Cookie', admin);
    expect(list.status).toBe(200);
    expect(list.body.webhooks.map((w: WebhookDto) => w.id)).toEqual([main.webhook.id]);
    expect(JSON.stringify(list.body)).not.toContain(main.secret);
    expect(list.body.policy).toMatchObject({ httpsOnly: false, retryScheduleSeconds: [0.2, 0.2, 0.2] });
  });

  it('bad input is a 400 naming the field, and nothing is stored', async () => {
    for (const url of ['not a url', 'ftp://builds.corvid-lantern.test/x', 'https://user:pw@builds.corvid-lantern.test/x', '']) {
      const res = await post(admin, hooks(), { url, events: ['channel.moved'] });
      expect(res.status, url).toBe(400);
      expect(Object.keys(res.body.error.fields), url).toEqual(['url']);
    }
    const noEvents = await post(admin, hooks(), { url: `${receiver.url}/x`, events: [] });
    expect(noEvents.body.error.fields.events).toMatch(/at least one event/);
    const unknown = await post(admin, hooks(), { url: `${receiver.url}/x`, events: ['curve.saved'] });
    expect(unknown.body.error.fields['events[0]']).toMatch(/must be one of/);
    expect((await request(t.app).get(hooks()).set('Cookie', admin)).body.webhooks).toHaveLength(1);
  });

  it('without WEBHOOK_ALLOW_PRIVATE_TARGETS, http:// and loopback targets are refused naming url', async () => {
    const strict = { ...t.ctx, config: { ...t.config, webhooks: { ...t.config.webhooks, allowPrivateTargets: false } } };
    for (const url of [`${receiver.url}/x`, 'https://127.0.0.1/x', 'https://localhost/x']) {
      const err = await createWebhook(strict, team, { url, events: ['channel.moved'], description: '' }, adminId).catch((e: unknown) => e);
      expect(err).toBeInstanceOf(HttpError);
      expect((err as HttpError).status).toBe(400);
      expect(Object.keys((err as HttpError).fields ?? {})).toEqual(['url']);
    }
  });

  it('leads and animators get 403 on every webhook route', async () => {
    for (const who of [lead, animator]) {
      expect((await request(t.app).get(hooks()).set('Cookie', who)).status).toBe(403);
      expect((await post(who, hooks(), { url: `${receiver.url}/x`, events: ['channel.moved'] })).status).toBe(403);
      expect((await post(who, `${hooks()}/${main.webhook.id}/ping`)).status).toBe(403);
      expect((await request(t.app).get(`${hooks()}/${main.webhook.id}/deliveries`).set('Cookie', who)).status).toBe(403);
    }
  });

  it('propose → request changes → propose → approve → release: the receiver gets each event once, signed', async () => {
    expect((await proposeAndWait(t.app, animator, team, 'menu-transitions', 'webhook test v1')).version.number).toBe(1);
    expect((await post(lead, `${pack()}/versions/1/reviews`, { decision: 'request-changes', comment: 'ease the landing' })).status).toBe(201);
    expect((await proposeAndWait(t.app, animator, team, 'menu-transitions', 'webhook test v2')).version.number).toBe(2);
    expect((await post(lead, `${pack()}/versions/2/reviews`, { decision: 'approve' })).status).toBe(201);
    const rel = await request(t.app).put(`${pack()}/channels/shipping`).set('Cookie', lead).set('Origin', ORIGIN).send({ version: 2 });
    expect(rel.status).toBe(200);

    const got = await waitFor('five events at /main', () => at('/main').length >= 5 && at('/main'));
    expect(got.map((r) => r.json.type).sort()).toEqual(['channel.moved', 'version.approved', 'version.changes-requested', 'version.proposed', 'version.proposed']);
    for (const r of got) {
      expect(signatureValid(r, main.secret), r.json.type).toBe(true);
      expect(signatureValid(r, `${main.secret}x`)).toBe(false);
      expect(r.headers['content-type']).toBe('application/json');
      expect(r.headers['tangentry-event']).toBe(r.json.type);
      expect(r.json.team).toMatchObject({ id: team, slug: 'ui-motion' });
      expect(r.json.pack?.slug).toBe('menu-transitions');
      expect(Number.isNaN(Date.parse(r.json.at))).toBe(false);
    }
    const moved = got.find((r) => r.json.type === 'channel.moved')!;
    expect(moved.json.subject).toMatchObject({ kind: 'channel', label: 'shipping' });
    expect(moved.json.data).toMatchObject({ channel: 'shipping', from: null, to: 2 });

    const list = await waitFor('all delivered', async () => {
      const l = await deliveries(main.webhook.id);
      return l.deliveries.every((d) => d.state === 'delivered') && l;
    });
    expect(list.total).toBe(5);
    expect(list.deliveries[0]!.eventType).toBe('channel.moved'); // newest first
    expect(new Set(list.deliveries.map((d) => d.id))).toEqual(new Set(got.map((r) => String(r.headers['tangentry-delivery']))));
    for (const d of list.deliveries) {
      expect(d).toMatchObject({ state: 'delivered', attempts: 1, maxAttempts: 4, lastStatusCode: 204, lastError: null });
      expect(d.lastResponseMs).toBeGreaterThanOrEqual(0);
      expect(d.log).toHaveLength(1);
    }
    const page2 = await deliveries(main.webhook.id, '?perPage=2&page=2');
    expect(page2).toMatchObject({ page: 2, perPage: 2, total: 5 });
    expect(page2.deliveries.map((d) => d.id)).toEqual(list.deliveries.slice(2, 4).map((d) => d.id));
    expect((await request(t.app).get(`${hooks()}/${main.webhook.id}/deliveries?perPage=500`).set('Cookie', admin)).body.error.fields.perPage).toMatch(/1–100/);
  });

  it('a receiver that fails twice (500) then succeeds: delivered on the third attempt, every attempt recorded', async () => {
    const flaky = await register('/flaky-1', ['channel.moved']);
    expect((await request(t.app).put(`${pack()}/channels/nightly`).set('Cookie', lead).set('Origin', ORIGIN).send({ version: 2 })).status).toBe(200);
    const d = await waitFor('the flaky delivery delivered', async () => {
      const l = await deliveries(flaky.webhook.id);
      return l.deliveries[0]?.state === 'delivered' && l.deliveries[0];
    });
    expect(d.attempts).toBe(3);
    expect(d.log.map((a) => a.statusCode)).toEqual([500, 500, 204]);
    expect(d.log[0]!.error).toMatch(/answered 500/);
    expect(d.lastError).toBeNull();
    const calls = at('/flaky-1');
    expect(calls).toHaveLength(3);
    expect(new Set(calls.map((c) => c.body)).size).toBe(1); // the same bytes each time
    expect(calls.every((c) => signatureValid(c, flaky.secret))).toBe(true);
    // the retry waited at least the configured 0.2 s
    expect(Date.parse(d.log[1]!.at) - Date.parse(d.log[0]!.at)).toBeGreaterThanOrEqual(180);
  });

  it('a receiver that never succeeds: failed after the last attempt of the schedule', async () => {
    const down = await register('/down', ['channel.moved']);
    expect((await post(admin, `${hooks()}/${down.webhook.id}/ping`)).status).toBe(202);
    const d = await waitFor('the ping failed', async () => {
      const l = await deliveries(down.webhook.id);
      return l.deliveries[0]?.state === 'failed' && l.deliveries[0];
    });
    expect(d.attempts).toBe(4);
    expect(d.nextAttemptAt).toBeNull();
    expect(d.lastStatusCode).toBe(500);
    expect(at('/down')).toHaveLength(4);
    await new Promise((r) => setTimeout(r, 400));
    expect(at('/down')).toHaveLength(4); // no fifth attempt
  });

  it('redeliver from the API: the same event and body again, a new delivery id, signed', async () => {
    const first = (await deliveries(main.webhook.id)).deliveries.at(-1)!;
    const before = at('/main').length;
    const res = await post(admin, `${hooks()}/${main.webhook.id}/deliveries/${first.id}/redeliver`);
    expect(res.status).toBe(202);
    expect(res.body.delivery).toMatchObject({ eventId: first.eventId, redeliveryOf: first.id, state: 'pending' });
    const again = await waitFor('the redelivery', () => at('/main').length > before && at('/main').at(-1));
    expect(again.json.id).toBe(first.eventId);
    expect(again.headers['tangentry-delivery']).toBe(res.body.delivery.id);
    const original = receiver.got.find((r) => r.headers['tangentry-delivery'] === first.id)!;
    expect(again.body).toBe(original.body);
    expect(signatureValid(again, main.secret)).toBe(true);
    expect((await post(admin, `${hooks()}/${main.webhook.id}/deliveries/00000000-0000-4000-8000-000000000000/redeliver`)).status).toBe(404);
  });

  it('ping, then rotate the secret: later deliveries verify only with the new one', async () => {
    const ping = await post(admin, `${hooks()}/${main.webhook.id}/ping`);
    expect(ping.status).toBe(202);
    const got = await waitFor('the ping', () => receiver.got.find((r) => r.headers['tangentry-delivery'] === ping.body.delivery.id));
    expect(got.json.type).toBe('ping');
    expect(signatureValid(got, main.secret)).toBe(true);
    const rotated = await post(admin, `${hooks()}/${main.webhook.id}/rotate-secret`);
    expect(rotated.status).toBe(200);
    expect(rotated.body.secret).not.toBe(main.secret);
    expect(rotated.body.webhook.secretRotatedAt).not.toBeNull();
    const ping2 = await post(admin, `${hooks()}/${main.webhook.id}/ping`);
    const got2 = await waitFor('the second ping', () => receiver.got.find((r) => r.headers['tangentry-delivery'] === ping2.body.delivery.id));
    expect(signatureValid(got2, rotated.body.secret)).toBe(true);
    expect(signatureValid(got2, main.secret)).toBe(false);
    main.secret = rotated.body.secret;
  });

  it('change, turn off, delete: a turned-off webhook gets nothing, a deleted one is gone', async () => {
    const w = await register('/toggle', ['version.proposed']);
    const bad = await request(t.app).patch(`${hooks()}/${w.webhook.id}`).set('Cookie', admin).set('Origin', ORIGIN).send({ url: 'nope' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.url).toBeTruthy();
    const off = await request(t.app).patch(`${hooks()}/${w.webhook.id}`).set('Cookie', admin).set('Origin', ORIGIN).send({ active: false, events: ['channel.moved', 'version.proposed'], description: 'paused' });
    expect(off.status).toBe(200);
    expect(off.body.webhook).toMatchObject({ active: false, events: ['version.proposed', 'channel.moved'], description: 'paused' });
    await proposeAndWait(t.app, animator, team, 'menu-transitions', 'while paused');
    await waitFor('the event reached /main', () => at('/main').some((r) => r.json.data.changelog === 'while paused'));
    expect((await deliveries(w.webhook.id)).total).toBe(0);
    expect((await post(admin, `${hooks()}/${w.webhook.id}/ping`)).status).toBe(409);
    expect((await request(t.app).delete(`${hooks()}/${w.webhook.id}`).set('Cookie', admin).set('Origin', ORIGIN)).status).toBe(204);
    expect((await request(t.app).delete(`${hooks()}/${w.webhook.id}`).set('Cookie', admin).set('Origin', ORIGIN)).status).toBe(404);
  });

  it('two dispatchers on one database (two API instances) deliver each delivery exactly once', async () => {
    const w = await register('/slow', ['channel.moved']);
    const other = createContext(t.config);
    const second = createWebhookDispatcher(other);
    try {
      const rows = Array.from({ length: 30 }, (_, i) => ({ webhookId: w.webhook.id, eventType: 'ping', eventId: crypto.randomUUID(), payload: JSON.stringify({ id: `n${i}`, type: 'ping' }) }));
      const inserted = await insertDeliveries(rows);
      const [mine, theirs] = await Promise.all([dispatcher.runOnce(), second.runOnce()]);
      // both instances took a share (a batch is 10 and each attempt waits 30 ms at the receiver)
      expect(mine).toBeGreaterThan(0);
      expect(theirs).toBeGreaterThan(0);
      await waitFor('30 deliveries at /slow', () => at('/slow').length >= 30);
      await new Promise((r) => setTimeout(r, 300));
      const ids = at('/slow').map((r) => String(r.headers['tangentry-delivery']));
      expect(ids).toHaveLength(30);
      expect(new Set(ids)).toEqual(new Set(inserted.map((d) => d.id)));
      const l = await deliveries(w.webhook.id, '?perPage=100');
      expect(l.deliveries.every((d) => d.state === 'delivered' && d.attempts === 1)).toBe(true);
    } finally {
      await second.stop();
      await closeContext(other);
    }
  });
});
