import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import request from 'supertest';
import { createHash } from 'node:crypto';
import { GetObjectCommand, HeadObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail } from '../support/accounts';
import { readPack } from '../../shared/bake';
import { parseCurveDocument } from '../../shared/curve';
import type { VersionDto } from '../../shared/schemas/versions';
import type { CurveDto } from '../../shared/schemas/packs';
import { PackVersion, VersionArtifact } from '../../server/models';
import { proposeAndWait, versionOfBake, waitForBake } from '../support/bakes';

const PASSWORD = 'versions password 1';
const sha256 = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

describe('pack versions API', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let team = '';
  let animator = '';
  let viewer = '';
  let first: VersionDto;

  beforeAll(async () => {
    // no automatic retry: the injected storage failure below must leave the bake failed, to retry by hand
    t = await testApp({ label: 'versions', seed: true, env: { TANGENTRY_BAKE_RETRY_LIMIT: '0' } });
    team = await teamId('ui-motion');
    const cookies: string[] = [];
    for (const role of ['animator', 'viewer'] as const) {
      const email = uniqueEmail(`versions-${role}`);
      await createPerson({ email, password: PASSWORD, teams: { 'ui-motion': role } });
      cookies.push(await signIn(t.app, email, PASSWORD));
    }
    [animator, viewer] = cookies as [string, string];
  });
  afterAll(async () => t?.close());

  const url = (slug = 'menu-transitions') => `/api/teams/${team}/packs/${slug}/versions`;
  const propose = (changelog: unknown, cookie = animator, slug?: string) =>
    request(t.app).post(url(slug)).set('Cookie', cookie).set('Origin', ORIGIN).send({ changelog });
  const proposeDone = (changelog: string, slug = 'menu-transitions') => proposeAndWait(t.app, animator, team, slug, changelog);
  const bytesOf = async (key: string) => {
    const r = await t.ctx.s3.send(new GetObjectCommand({ Bucket: t.config.s3.bucket, Key: key }));
    return new Uint8Array(await r.Body!.transformToByteArray());
  };

  it('an animator proposes v1: source and every target’s artifacts are in the bucket with the recorded SHA-256', async () => {
    const started = Date.now();
    const { bake, version } = await proposeDone('First cut of the menu motion.');
    const ms = Date.now() - started;
    expect(bake).toMatchObject({ state: 'done', version: 1, progress: { done: 4, total: 4 } });
    first = version;
    expect(first).toMatchObject({ number: 1, changelog: 'First cut of the menu motion.', state: 'proposed', curveCount: 4 });
    // the seeded team has the brief's four targets; JSON, binary, C99 header, TypeScript module and glTF each, CSS for Web
    const per = (t: string) => ['json', 'binary', 'c', 'ts', 'gltf'].map((f) => `${t}:${f}`);
    expect(first.artifacts.map((a) => `${a.profileName ?? '-'}:${a.format}`)).toEqual([
      '-:source', ...per('Console'), ...per('Handheld'), ...per('Mobile'), ...per('Web'), 'Web:css',
    ]);
    for (const a of first.artifacts) {
      expect(a.key).toBe(`sha256/${a.sha256}`);
      const head = await t.ctx.s3.send(new HeadObjectCommand({ Bucket: t.config.s3.bucket, Key: a.key }));
      expect(head.ContentLength).toBe(a.size);
      expect(sha256(await bytesOf(a.key))).toBe(a.sha256);
    }
    expect(first.source).toEqual({ key: first.artifacts[0]!.key, sha256: first.artifacts[0]!.sha256, size: first.artifacts[0]!.size });
    console.log(`propose v1 of menu-transitions (4 curves × 4 targets, background bake + ${first.artifacts.length} objects, until the version is readable): ${ms} ms`);
  });

  it('the stored source holds every curve document of the pack, valid and in order', async () => {
    const src = JSON.parse(new TextDecoder().decode(await bytesOf(first.source.key)));
    const curves: CurveDto[] = (await request(t.app).get(`/api/teams/${team}/packs/menu-transitions`).set('Cookie', viewer)).body.curves;
    expect(src.format).toBe('tangentry.pack-source');
    expect(src.curves).toEqual(curves.map((c) => c.document));
    for (const d of src.curves) expect(parseCurveDocument(d).ok).toBe(true);
  });

  it('the binary artifact reads back with the runtime reader and names every curve baked for that target', async () => {
    const bin = first.artifacts.find((a) => a.profileName === 'Console' && a.format === 'binary')!;
    const json = JSON.parse(new TextDecoder().decode(await bytesOf(first.artifacts.find((a) => a.profileName === 'Console' && a.format === 'json')!.key)));
    const baked = json.curves.filter((c: { error?: string }) => !c.error).map((c: { name: string }) => c.name);
    expect(readPack(await bytesOf(bin.key)).map((c) => c.name)).toEqual(baked);
    const summary = first.bakeSummary.find((s) => s.profile === 'Console')!;
    expect(summary.curves).toBe(4);
    expect(summary.failed).toBe(summary.failures.length);
    expect(baked.length).toBe(4 - summary.failed);
  });

  it('downloads stream the artifact with its size and SHA-256', async () => {
    const a = first.artifacts.find((x) => x.format === 'binary')!;
    const res = await request(t.app).get(`${url()}/1/artifacts/${a.id}`).set('Cookie', viewer).buffer(true).parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    expect(res.headers['x-content-sha256']).toBe(a.sha256);
    expect(res.headers['content-disposition']).toContain('menu-transitions-v1-console.tgpk');
    expect(sha256(new Uint8Array(res.body as Buffer))).toBe(a.sha256);
    expect((res.body as Buffer).length).toBe(a.size);
    // a build server that already has these bytes: If-None-Match with the checksum → 304, nothing sent
    const again = await request(t.app).get(`${url()}/1/artifacts/${a.id}`).set('Cookie', viewer).set('If-None-Match', `"${a.sha256}"`);
    expect(again.status).toBe(304);
    expect(again.headers.etag).toBe(`"${a.sha256}"`);
  });

  it('a second identical version reuses every stored object (no upload) and gets the next number', async () => {
    // the in-process worker shares t.ctx.s3, so the spy sees the request's and the bake's storage calls
    const send = vi.spyOn(t.ctx.s3, 'send');
    const { version: second } = await proposeDone('Same curves, proposed again.');
    const puts = send.mock.calls.filter(([c]) => c instanceof PutObjectCommand).length;
    const heads = send.mock.calls.filter(([c]) => c instanceof HeadObjectCommand).length;
    send.mockRestore();
    expect(second.number).toBe(2);
    expect(puts).toBe(0);
    expect(heads).toBe(first.artifacts.length);
    expect(second.artifacts.map((a) => a.key)).toEqual(first.artifacts.map((a) => a.key));
    const list = (await request(t.app).get(url()).set('Cookie', viewer)).body.versions.map((v: VersionDto) => v.number);
    expect(list).toEqual([2, 1]);
  });

  it('bad input names the field and stores nothing', async () => {
    const before = await PackVersion.count();
    const res = await propose('   ');
    expect(res.status).toBe(400);
    expect(res.body.error.fields.changelog).toMatch(/^changelog:/);
    expect(await PackVersion.count()).toBe(before);
  });

  it('a storage failure part-way leaves no version and no artifact rows; a retry then succeeds', async () => {
    // new content (a changed curve) so objects must be uploaded, and the third upload fails
    const pack = `/api/teams/${team}/packs/audio-fades`;
    const c: CurveDto = (await request(t.app).get(pack).set('Cookie', viewer)).body.curves[0];
    const changed = { ...c.document, keys: c.document.keys.map((k, i) => (i === 0 ? { ...k, value: 0.9 } : k)) };
    expect((await request(t.app).put(`${pack}/curves/${c.id}`).set('Cookie', animator).set('Origin', ORIGIN).send({ document: changed, revision: c.revision })).status).toBe(200);
    const [versions, artifacts] = [await PackVersion.count(), await VersionArtifact.count()];
    const real = t.ctx.s3.send.bind(t.ctx.s3);
    let puts = 0;
    const send = vi.spyOn(t.ctx.s3, 'send').mockImplementation(((cmd: unknown) => {
      if (cmd instanceof PutObjectCommand && ++puts === 3) return Promise.reject(new Error('injected storage failure'));
      return real(cmd as never);
    }) as never);
    const res = await propose('Louder start.', animator, 'audio-fades');
    expect(res.status).toBe(202);
    const failed = await waitForBake(t.app, animator, team, 'audio-fades', res.body.bake.id);
    send.mockRestore();
    expect(failed.state).toBe('failed');
    expect(failed.failure?.reason).toMatch(/could not store .*injected storage failure/);
    expect(failed.failure?.target).toBeTruthy();
    expect(failed.version).toBeNull();
    expect([await PackVersion.count(), await VersionArtifact.count()]).toEqual([versions, artifacts]);
    expect((await request(t.app).get(url('audio-fades')).set('Cookie', viewer)).body.versions).toEqual([]);
    const retry = await request(t.app).post(`/api/teams/${team}/packs/audio-fades/bakes/${failed.id}/retry`).set('Cookie', animator).set('Origin', ORIGIN);
    expect(retry.status).toBe(202);
    const done = await waitForBake(t.app, animator, team, 'audio-fades', failed.id);
    expect((await versionOfBake(t.app, animator, team, 'audio-fades', done)).number).toBe(1);
  });

  it('a viewer cannot propose; an unknown version is 404', async () => {
    expect((await propose('nope', viewer)).status).toBe(403);
    expect((await request(t.app).get(`${url()}/99`).set('Cookie', viewer)).status).toBe(404);
  });
});
