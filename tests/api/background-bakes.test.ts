/**
 * Background bakes (issue 7 part 2) against the real PostgreSQL, pg-boss on it, and the S3 fake through
 * @aws-sdk/client-s3. The app's S3 endpoint is a TCP relay in front of the fake, so the test can take
 * storage away mid-bake (every connection cut, the port closed) and bring it back on the same port.
 * The worker runs inside the test's process (TANGENTRY_WORKER=inline, the default); a pause after each
 * target (TANGENTRY_BAKE_DELAY_MS) makes progress observable and the outage land between targets.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createHash } from 'node:crypto';
import { createServer, connect, type Server, type Socket, type AddressInfo } from 'node:net';
import { GetObjectCommand, HeadObjectCommand } from '@aws-sdk/client-s3';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail } from '../support/accounts';
import { proposeAndWait, versionOfBake, waitForBake } from '../support/bakes';
import { requireEnv } from '../support/database';
import { PackVersion, VersionArtifact, VersionBake } from '../../server/models';
import type { BakeDto, VersionDto } from '../../shared/schemas/versions';
import type { CurveDto } from '../../shared/schemas/packs';

const PASSWORD = 'bakes password 1';
const sha256 = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

/** A TCP relay to the S3 fake that can be cut (connections destroyed, port closed) and reopened on the same port. */
function storageRelay(target: URL) {
  let server: Server | null = null;
  const sockets = new Set<Socket>();
  let port = 0;
  const open = () => new Promise<void>((resolve, reject) => {
    server = createServer((client) => {
      const upstream = connect(Number(target.port), target.hostname);
      for (const s of [client, upstream]) {
        sockets.add(s);
        s.on('error', () => { client.destroy(); upstream.destroy(); });
        s.on('close', () => { sockets.delete(s); client.destroy(); upstream.destroy(); });
      }
      client.pipe(upstream).pipe(client);
    });
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => {
      port = (server!.address() as AddressInfo).port;
      resolve();
    });
  });
  const cut = () => new Promise<void>((resolve) => {
    const s = server;
    server = null;
    for (const c of sockets) c.destroy();
    if (!s) return resolve();
    s.close(() => resolve());
  });
  return { open, cut, endpoint: () => `http://127.0.0.1:${port}` };
}

describe('background bakes: 202, progress, one version when every object is stored', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  const relay = storageRelay(new URL(requireEnv('S3_ENDPOINT')));
  let ui = '';
  let feel = '';
  let animator = '';
  let viewer = '';

  beforeAll(async () => {
    await relay.open();
    t = await testApp({
      label: 'bakes', seed: true,
      env: { S3_ENDPOINT: relay.endpoint(), TANGENTRY_BAKE_DELAY_MS: '250', TANGENTRY_BAKE_RETRY_LIMIT: '0', TANGENTRY_JOBS_POLL_SECONDS: '0.5' },
    });
    [ui, feel] = [await teamId('ui-motion'), await teamId('gameplay-feel')];
    const cookies: string[] = [];
    for (const role of ['animator', 'viewer'] as const) {
      const email = uniqueEmail(`bakes-${role}`);
      await createPerson({ email, password: PASSWORD, teams: { 'ui-motion': role, 'gameplay-feel': role } });
      cookies.push(await signIn(t.app, email, PASSWORD));
    }
    [animator, viewer] = cookies as [string, string];
  });
  afterAll(async () => {
    await t?.close();
    await relay.cut();
  });

  const pack = (team: string, slug: string) => `/api/teams/${team}/packs/${slug}`;
  const propose = (team: string, slug: string, changelog: string) =>
    request(t.app).post(`${pack(team, slug)}/versions`).set('Cookie', animator).set('Origin', ORIGIN).send({ changelog });
  const bytesOf = async (key: string) => {
    const r = await t.ctx.s3.send(new GetObjectCommand({ Bucket: t.config.s3.bucket, Key: key }));
    return new Uint8Array(await r.Body!.transformToByteArray());
  };
  const versionsOf = async (team: string, slug: string) => (await request(t.app).get(`${pack(team, slug)}/versions`).set('Cookie', viewer)).body.versions as VersionDto[];

  it('propose answers 202 with a queued bake, reports progress per target, and the version appears with every object stored under its SHA-256', async () => {
    const res = await propose(ui, 'menu-transitions', 'First background bake.');
    expect(res.status).toBe(202);
    const queued: BakeDto = res.body.bake;
    expect(queued).toMatchObject({ state: 'queued', progress: { done: 0, total: 4 }, version: null, changelog: 'First background bake.', curveCount: 4 });
    expect(res.headers.location).toBe(`${pack(ui, 'menu-transitions')}/bakes/${queued.id}`);
    // not a version yet
    expect(await versionsOf(ui, 'menu-transitions')).toEqual([]);

    // while it is open the pack's list of bakes has it (the bake takes over a second: a 250 ms pause per target)
    const openBakes = async () => ((await request(t.app).get(`${pack(ui, 'menu-transitions')}/bakes`).set('Cookie', viewer)).body.bakes as BakeDto[]).map((b) => b.id);
    expect(await openBakes()).toContain(queued.id);
    const seen = new Set<string>();
    const done = await waitForBake(t.app, viewer, ui, 'menu-transitions', queued.id, {
      until: (b) => {
        seen.add(`${b.state}:${b.progress.done}`);
        return b.state === 'done' || b.state === 'failed';
      },
    });
    expect(await openBakes()).not.toContain(queued.id); // done: no longer listed, the version is
    expect(done).toMatchObject({ state: 'done', version: 1, progress: { done: 4, total: 4 }, attempts: 1, failure: null });
    // progress was reported between targets (the 250 ms pause after each makes at least one visible)
    expect([...seen].some((s) => /^baking:[123]$/.test(s)), `progress seen: ${[...seen].join(', ')}`).toBe(true);

    const v = await versionOfBake(t.app, viewer, ui, 'menu-transitions', done);
    expect(v).toMatchObject({ number: 1, changelog: 'First background bake.', curveCount: 4, state: 'proposed' });
    expect(v.source).toEqual(queued.source);
    // every artifact: the object exists in the bucket (HeadObject size) and its bytes hash to the recorded SHA-256
    expect(v.artifacts.length).toBe(1 + 4 * 5 + 1); // source; json, binary, c, ts, gltf per target; css for Web
    for (const a of v.artifacts) {
      expect(a.key).toBe(`sha256/${a.sha256}`);
      const head = await t.ctx.s3.send(new HeadObjectCommand({ Bucket: t.config.s3.bucket, Key: a.key }));
      expect(head.ContentLength).toBe(a.size);
      expect(sha256(await bytesOf(a.key))).toBe(a.sha256);
    }
    // the new formats are what their writers produce: a C99 header with the evaluator, a TS module, glTF 2.0 JSON
    const text = async (format: string) => new TextDecoder().decode(await bytesOf(v.artifacts.find((a) => a.profileName === 'Console' && a.format === format)!.key));
    expect(await text('c')).toMatch(/#ifndef TANGENTRY_PACK_MENU_TRANSITIONS_CONSOLE_H/);
    expect(await text('ts')).toMatch(/export const curves: TangentryCurve\[\] = \[/);
    const gltf = JSON.parse(await text('gltf'));
    expect(gltf.asset.version).toBe('2.0'); // Khronos glTF 2.0 §5.2 asset.version
    expect(gltf.animations[0].channels.length).toBe(4 - v.bakeSummary.find((s) => s.profile === 'Console')!.failed - (v.bakeSummary.find((s) => s.profile === 'Console')!.omitted?.length ?? 0));
  });

  it('the proposal is a snapshot: a curve edited right after proposing does not change the version', async () => {
    const before: CurveDto[] = (await request(t.app).get(pack(ui, 'audio-fades')).set('Cookie', viewer)).body.curves;
    const res = await propose(ui, 'audio-fades', 'Snapshot check.');
    expect(res.status).toBe(202);
    const c = before[0]!;
    const edited = { ...c.document, keys: c.document.keys.map((k, i) => (i === 0 ? { ...k, value: 0.77 } : k)) };
    expect((await request(t.app).put(`${pack(ui, 'audio-fades')}/curves/${c.id}`).set('Cookie', animator).set('Origin', ORIGIN).send({ document: edited, revision: c.revision })).status).toBe(200);
    const v = await versionOfBake(t.app, viewer, ui, 'audio-fades', await waitForBake(t.app, viewer, ui, 'audio-fades', res.body.bake.id));
    const src = JSON.parse(new TextDecoder().decode(await bytesOf(v.source.key)));
    expect(src.curves).toEqual(before.map((x) => x.document));
  });

  it('two proposals of one pack at once get distinct version numbers', async () => {
    const [a, b] = await Promise.all([propose(feel, 'camera-moves', 'concurrent A'), propose(feel, 'camera-moves', 'concurrent B')]);
    expect([a.status, b.status]).toEqual([202, 202]);
    const [da, db] = await Promise.all([waitForBake(t.app, viewer, feel, 'camera-moves', a.body.bake.id), waitForBake(t.app, viewer, feel, 'camera-moves', b.body.bake.id)]);
    expect([da.state, db.state]).toEqual(['done', 'done']);
    expect([da.version, db.version].sort()).toEqual([1, 2]);
    const list = await versionsOf(feel, 'camera-moves');
    expect(list.map((v) => v.number)).toEqual([2, 1]);
    expect(list.map((v) => v.changelog).sort()).toEqual(['concurrent A', 'concurrent B']);
    // the team heard of both (a bake is not a version until done, so the versions list is the proof here)
  });

  it('storage taken away mid-bake: the bake fails naming the target and the reason, no version and no artifact rows; retried once storage is back, one version', async () => {
    const packId = (await request(t.app).get(pack(feel, 'hit-flashes')).set('Cookie', viewer)).body.pack.id as string;
    const artifactsBefore = await VersionArtifact.count();
    const res = await propose(feel, 'hit-flashes', 'Brightness caps.');
    expect(res.status).toBe(202);
    const id = res.body.bake.id as string;
    const mid = await waitForBake(t.app, viewer, feel, 'hit-flashes', id, { until: (b) => b.state !== 'queued' && b.progress.done >= 1, ms: 20_000 });
    expect(mid.progress.done, 'the outage must land before the last target').toBeLessThan(mid.progress.total);
    await relay.cut();
    // the API reads PostgreSQL only, so following the bake still works with storage down
    const failed = await waitForBake(t.app, viewer, feel, 'hit-flashes', id);
    expect(failed.state).toBe('failed');
    expect(failed.failure?.target).toMatch(/^(Console|Handheld|Mobile|Web)$/);
    expect(failed.failure?.reason).toMatch(/could not store the (Console|Handheld|Mobile|Web) \w+ output: .+/);
    expect(failed.version).toBeNull();
    expect(await PackVersion.count({ where: { packId } })).toBe(0);
    expect(await VersionArtifact.count()).toBe(artifactsBefore);
    expect(await versionsOf(feel, 'hit-flashes')).toEqual([]);
    const open = (await request(t.app).get(`${pack(feel, 'hit-flashes')}/bakes`).set('Cookie', viewer)).body.bakes as BakeDto[];
    expect(open.map((b) => [b.id, b.state])).toEqual([[id, 'failed']]);
    // a viewer cannot retry; a bake that is not failed cannot be retried
    expect((await request(t.app).post(`${pack(feel, 'hit-flashes')}/bakes/${id}/retry`).set('Cookie', viewer).set('Origin', ORIGIN)).status).toBe(403);

    await relay.open(); // same port: the app's S3 client reaches the fake again
    const retry = await request(t.app).post(`${pack(feel, 'hit-flashes')}/bakes/${id}/retry`).set('Cookie', animator).set('Origin', ORIGIN);
    expect(retry.status).toBe(202);
    expect(retry.body.bake).toMatchObject({ id, state: 'queued', failure: null });
    const done = await waitForBake(t.app, viewer, feel, 'hit-flashes', id);
    expect(done).toMatchObject({ state: 'done', version: 1, attempts: 2 });
    expect(await PackVersion.count({ where: { packId } })).toBe(1);
    const again = await request(t.app).post(`${pack(feel, 'hit-flashes')}/bakes/${id}/retry`).set('Cookie', animator).set('Origin', ORIGIN);
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('not_failed');
    expect(await VersionBake.count({ where: { packId } })).toBe(1);
  });

  it('proposeAndWait follows a bake to its version (the helper other tests use)', async () => {
    const { bake, version } = await proposeAndWait(t.app, animator, ui, 'menu-transitions', 'Second cut.');
    expect(bake).toMatchObject({ state: 'done', version: 2 });
    expect(version.number).toBe(2);
  });

  it('an unknown bake is 404; bad input stores nothing', async () => {
    expect((await request(t.app).get(`${pack(ui, 'menu-transitions')}/bakes/00000000-0000-4000-8000-000000000000`).set('Cookie', viewer)).status).toBe(404);
    expect((await request(t.app).get(`${pack(ui, 'menu-transitions')}/bakes/not-a-uuid`).set('Cookie', viewer)).status).toBe(404);
    const before = await VersionBake.count();
    const bad = await propose(ui, 'menu-transitions', '   ');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.changelog).toMatch(/^changelog:/);
    expect(await VersionBake.count()).toBe(before);
  });
});
