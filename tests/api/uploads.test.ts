import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import validator from 'gltf-validator';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail } from '../support/accounts';
import { createToken } from '../../server/tokens/tokens.service';
import { createPack } from '../../server/packs/packs.service';
import { evaluate, prepareCurve, type CurveDocument } from '../../shared/curve';
import type { CurveDto } from '../../shared/schemas/packs';
import type { UploadFileResult } from '../../shared/schemas/uploads';
import type { TeamEvent } from '../../server/events/team-events';
import { writeGltf } from '../../shared/convert';
import { HERO_KEYS, buildFixtureGltf, smoothstep } from '../fixtures/uploads/gltf-fixture';

const PASSWORD = 'uploads password 1';

const doc = (name: string): CurveDocument => ({
  format: 'tangentry.curve', version: 1, name, units: { time: 's', value: 'progress' }, before: 'clamp', after: 'clamp',
  frameRate: 60, drives: 'position', tags: ['test'],
  keys: [
    { time: 0, value: 0, slopeIn: 0, slopeOut: 0, rule: 'manual', slopes: 'joined' },
    { time: 0.4, value: 0.8, slopeIn: 1.5, slopeOut: 1.5, rule: 'manual', slopes: 'joined' },
    { time: 1, value: 1, slopeIn: 0, slopeOut: 0, rule: 'manual', slopes: 'joined' },
  ],
  segments: [{ kind: 'hermite' }, { kind: 'hermite' }],
});

// smoothstep(t) = t²(3 − 2t), the OpenGL Shading Language's smoothstep (GLSL 4.60 §8.3, edges 0 and 1),
// sampled at 61 evenly spaced times over [0, 1]
const N = 61;
const SAMPLE_T = Array.from({ length: N }, (_, i) => i / (N - 1));
const smoothCsv = ['time,value', ...SAMPLE_T.map((t) => `${t},${smoothstep(t)}`)].join('\n');

type Ok = Extract<UploadFileResult, { ok: true }>;
type Bad = Extract<UploadFileResult, { ok: false }>;

describe('bulk upload API: POST /api/teams/:teamId/packs/:pack/uploads', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let team = '';
  let animator = '';
  let viewer = '';
  let adminId = '';
  let otherTeamAdmin = '';
  const events: TeamEvent[] = [];

  beforeAll(async () => {
    t = await testApp({ label: 'uploads', seed: true });
    team = await teamId('ui-motion');
    const people = [['animator', { 'ui-motion': 'animator' }], ['viewer', { 'ui-motion': 'viewer' }], ['admin', { 'ui-motion': 'admin' }], ['other', { 'gameplay-feel': 'admin' }]] as const;
    const cookies: string[] = [];
    for (const [label, teams] of people) {
      const email = uniqueEmail(`uploads-${label}`);
      const id = await createPerson({ email, password: PASSWORD, teams: { ...teams } });
      if (label === 'admin') adminId = id;
      cookies.push(await signIn(t.app, email, PASSWORD));
    }
    [animator, viewer, , otherTeamAdmin] = cookies as [string, string, string, string];
    t.ctx.events.subscribe('uploads-test', (e) => { if (e.type === 'curves.uploaded') events.push(e); });
  });
  afterAll(async () => t?.close());

  const freshPack = async () => (await createPack(team, { name: `Uploads ${Math.random().toString(36).slice(2, 8)}`, description: '', frameRate: 30, tags: [] })).slug;
  const url = (slug: string) => `/api/teams/${team}/packs/${slug}/uploads`;
  const curvesOf = async (slug: string): Promise<CurveDto[]> =>
    (await request(t.app).get(`/api/teams/${team}/packs/${slug}/curves`).set('Cookie', animator)).body.curves;
  const upload = (cookie: string, slug: string) => request(t.app).post(url(slug)).set('Cookie', cookie).set('Origin', ORIGIN);

  it('the glTF fixture is valid glTF 2.0 (Khronos gltf-validator 2.0.0-dev.3.10: 0 errors, 0 warnings)', async () => {
    const r = await validator.validateBytes(buildFixtureGltf().bytes, { format: 'gltf', writeTimestamp: false });
    expect(r.issues.numErrors, JSON.stringify(r.issues.messages)).toBe(0);
    expect(r.issues.numWarnings, JSON.stringify(r.issues.messages)).toBe(0);
  });

  it('takes a CSV of samples, a curve document and a .gltf at once; each becomes curves of the pack', async () => {
    const slug = await freshPack();
    const before = events.length;
    const tol = 1e-4;
    const res = await upload(animator, slug)
      .field('tolerance', String(tol))
      .attach('files', Buffer.from(smoothCsv), 'smooth.csv')
      .attach('files', Buffer.from(JSON.stringify(doc('dock-ease'))), 'dock-ease.json')
      .attach('files', Buffer.from(buildFixtureGltf().bytes), 'walk.gltf');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const [csv, json, gltf] = res.body.results as Ok[];
    expect(res.body.results.map((r: UploadFileResult) => [r.file, r.ok])).toEqual([['smooth.csv', true], ['dock-ease.json', true], ['walk.gltf', true]]);

    // CSV: one curve named after the file, fewer keys than samples, within the tolerance
    expect(csv.curves).toHaveLength(1);
    expect(csv.curves[0]!.name).toBe('smooth');
    expect(csv.curves[0]!.keys).toBeLessThan(N);
    expect(csv.curves[0]!.maxError).toBeLessThanOrEqual(tol);
    const stored = await curvesOf(slug);
    const smooth = stored.find((c) => c.id === csv.curves[0]!.id)!;
    expect(smooth.document.keys).toHaveLength(csv.curves[0]!.keys);
    expect(smooth.document.frameRate).toBe(30); // the pack's
    // the stored curve, evaluated with shared/curve, against the samples it came from
    const c = prepareCurve(smooth.document);
    const atSamples = Math.max(...SAMPLE_T.map((x) => Math.abs(evaluate(c, x) - smoothstep(x))));
    expect(atSamples).toBeLessThanOrEqual(tol);
    // and between them against smoothstep itself (the fit measures between samples on the samples' Catmull-Rom reading)
    let between = 0;
    for (let i = 0; i <= 600; i++) between = Math.max(between, Math.abs(evaluate(c, i / 600) - smoothstep(i / 600)));
    expect(between).toBeLessThanOrEqual(2 * tol);

    // a curve document is stored as it is
    expect(json.curves.map((x) => [x.name, x.keys, x.maxError])).toEqual([['dock-ease', 3, 0]]);
    expect(stored.find((x) => x.id === json.curves[0]!.id)!.document).toEqual(doc('dock-ease'));

    // glTF: one curve per channel component, <file>-<node>-<path>-<component>
    expect(gltf.curves.map((x) => x.name)).toEqual([
      'walk-hero-translation-x', 'walk-hero-translation-y', 'walk-hero-translation-z',
      'walk-lamp-scale-x', 'walk-lamp-scale-y', 'walk-lamp-scale-z',
    ]);
    expect(gltf.curves.map((x) => x.keys)).toEqual([HERO_KEYS, HERO_KEYS, HERO_KEYS, 3, 3, 3]);
    const byName = (n: string) => prepareCurve(stored.find((x) => x.name === n)!.document);
    // LINEAR (glTF 2.0 Appendix C): the keys' float32 values at the key times, linear between them
    const hx = byName('walk-hero-translation-x');
    for (const k of [0, 7, 15, 30]) expect(evaluate(hx, k / 30)).toBeCloseTo(Math.fround(smoothstep(Math.fround(k / 30))), 6);
    expect(evaluate(byName('walk-hero-translation-y'), 0.25)).toBeCloseTo(0.5, 6);
    // STEP (glTF 2.0 Appendix C): the value of the key at or before t
    expect(evaluate(byName('walk-lamp-scale-y'), 0.75)).toBe(2);
    expect(evaluate(byName('walk-lamp-scale-y'), 0.25)).toBe(1);
    expect(stored).toHaveLength(8);

    // one event for the request, with the counts
    expect(events.length - before).toBe(1);
    const e = events[events.length - 1]!;
    expect(e.pack?.slug).toBe(slug);
    expect(e.data).toMatchObject({ files: 3, stored: 3, failed: 0, curves: 8 });
  });

  it('bad files get their own error beside the good ones, which are stored', async () => {
    const slug = await freshPack();
    const fakeGlb = Buffer.from('definitely not binary glTF, just text in a .glb');
    // a real GLB from the project's writer (checked against gltf-validator in tests/unit/convert/gltf-write.test.ts)
    const glb = writeGltf([{ name: 'fade', interpolation: 'LINEAR', times: new Float32Array([0, 0.5]), output: new Float32Array([1, 0]) }]).glb();
    const brokenGltf = buildFixtureGltf().json as { animations: { channels: { sampler: number }[] }[] };
    brokenGltf.animations[0]!.channels[1]!.sampler = 9; // the second channel names a sampler that is not there
    const res = await upload(animator, slug)
      .attach('files', Buffer.from('{"format": "tangentry.curve", oops'), 'notjson.json')
      .attach('files', Buffer.from('time,value\n0,0\n0.5,half\n1,1\n'), 'bad-row.csv')
      .attach('files', fakeGlb, 'fake.glb')
      .attach('files', Buffer.from('hello'), 'notes.txt')
      .attach('files', Buffer.from(JSON.stringify(brokenGltf)), 'broken.gltf')
      .attach('files', Buffer.from(JSON.stringify({ ...doc('wrong'), keys: [{ time: 0, value: 'x' }] })), 'wrong-doc.json')
      .attach('files', Buffer.from([0x30, 0x2c, 0x30, 0x0a, 0x00, 0x31]), 'binary.csv')
      .attach('files', Buffer.from(smoothCsv), 'good.csv')
      .attach('files', Buffer.from(glb), 'fade.glb');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const r = res.body.results as UploadFileResult[];
    expect(r.map((x) => [x.file, x.ok])).toEqual([
      ['notjson.json', false], ['bad-row.csv', false], ['fake.glb', false], ['notes.txt', false], ['broken.gltf', false], ['wrong-doc.json', false], ['binary.csv', false], ['good.csv', true], ['fade.glb', true],
    ]);
    const bad = r.filter((x): x is Bad => !x.ok);
    expect(bad[0]!.error).toMatch(/^not JSON/);
    expect(bad[1]!.error).toMatch(/^samples: line 3, column \d+: value "half" is not a number/);
    expect(bad[2]!.error).toMatch(/not a GLB.*magic/);
    expect(bad[3]!.error).toMatch(/"\.txt" files are not accepted/);
    expect(bad[4]!.error).toMatch(/^glTF: animations\[0\]\.channels\[1\]\.sampler: 9 does not exist/);
    expect(bad[5]!.field).toMatch(/^document\.keys\[0\]/);
    expect(bad[6]!.error).toMatch(/^not a text file/);
    for (const b of bad.slice(0, 5)) expect(b.field).toBe('files');
    // only the good file's curve exists: the broken glTF's first (readable) channel was not stored either
    expect((await curvesOf(slug)).map((c) => c.name)).toEqual(['good', 'fade-fade-weights-0']);
    expect(evaluate(prepareCurve((await curvesOf(slug))[1]!.document), 0.25)).toBeCloseTo(0.5, 6); // LINEAR halfway
  });

  it('a name already in the pack gets the next numbered name', async () => {
    const slug = await freshPack();
    const send = () => upload(animator, slug).attach('files', Buffer.from(JSON.stringify(doc('fade'))), 'fade.json').attach('files', Buffer.from(JSON.stringify(doc('fade'))), 'fade-again.json');
    expect(((await send()).body.results as Ok[]).map((x) => x.curves[0]!.name)).toEqual(['fade', 'fade-2']);
    expect(((await send()).body.results as Ok[]).map((x) => x.curves[0]!.name)).toEqual(['fade-3', 'fade-4']);
  });

  it('a JSON array of samples is reduced like a CSV; a tolerance it cannot reach is that file\'s error', async () => {
    const slug = await freshPack();
    const pairs = JSON.stringify(SAMPLE_T.map((x) => [x, smoothstep(x)]));
    const objects = JSON.stringify(SAMPLE_T.map((x) => ({ time: x, value: smoothstep(x) })));
    // white noise between ±0.5 cannot be followed within 1e-9 by fewer keys than samples
    const noise = ['time,value', ...Array.from({ length: 50 }, (_, i) => `${i / 49},${(((i * 7919) % 101) / 101) - 0.5}`)].join('\n');
    const res = await upload(animator, slug).field('tolerance', '1e-9')
      .attach('files', Buffer.from(noise), 'noise.csv');
    const [bad] = res.body.results as Bad[];
    expect(bad).toMatchObject({ file: 'noise.csv', ok: false, field: 'tolerance' });
    expect(bad!.error).toMatch(/could not be reduced within 1e-9/);
    const ok = await upload(animator, slug).attach('files', Buffer.from(pairs), 'pairs.json').attach('files', Buffer.from(objects), 'objects.json');
    const r = ok.body.results as Ok[];
    expect(r.map((x) => [x.file, x.ok, x.curves[0]!.name])).toEqual([['pairs.json', true, 'pairs'], ['objects.json', true, 'objects']]);
    for (const x of r) expect(x.curves[0]!.maxError).toBeLessThanOrEqual(1e-3); // the default tolerance
    expect((await curvesOf(slug)).map((c) => c.name)).toEqual(['pairs', 'objects']);
  });

  it('a file over the size limit is 413 naming the file and the field, and nothing of the request is stored', async () => {
    const slug = await freshPack();
    const big = Buffer.alloc(2 * 1024 * 1024 + 1, 0x30); // "000…", one byte over 2 MB
    const res = await upload(animator, slug)
      .attach('files', Buffer.from(smoothCsv), 'first.csv')
      .attach('files', big, 'huge.csv');
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('file_too_large');
    expect(res.body.error.message).toMatch(/"huge\.csv" is larger than 2 MB/);
    expect(res.body.error.fields.files).toMatch(/huge\.csv/);
    expect(await curvesOf(slug)).toEqual([]);
  });

  it('more files than the limit is 413, nothing stored', async () => {
    const slug = await freshPack();
    let req = upload(animator, slug);
    for (let i = 0; i < 51; i++) req = req.attach('files', Buffer.from('0,0\n1,1\n'), `f${i}.csv`);
    const res = await req;
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('too_many_files');
    expect(res.body.error.message).toMatch(/more than 50 files/);
    expect(await curvesOf(slug)).toEqual([]);
  });

  it('a bad tolerance, no files, or a file in another field is 400 naming the field', async () => {
    const slug = await freshPack();
    const tol = await upload(animator, slug).field('tolerance', 'tight').attach('files', Buffer.from(smoothCsv), 'a.csv');
    expect(tol.status).toBe(400);
    expect(tol.body.error.fields.tolerance).toMatch(/positive number/);
    // the message names the field once
    expect(tol.body.error.message).toMatch(/^tolerance: must be a positive number/);
    const none = await upload(animator, slug).send({});
    expect(none.status).toBe(400);
    expect(none.body.error.fields.files).toMatch(/choose at least one/);
    const other = await upload(animator, slug).attach('curve', Buffer.from(smoothCsv), 'a.csv');
    expect(other.status).toBe(400);
    expect(other.body.error.fields.curve).toMatch(/"files" field/);
    expect(await curvesOf(slug)).toEqual([]);
  });

  it('viewers, service tokens, strangers and other teams are refused before anything is read', async () => {
    const slug = await freshPack();
    const csv = Buffer.from(smoothCsv);
    expect((await upload(viewer, slug).attach('files', csv, 'a.csv')).status).toBe(403);
    const { secret } = await createToken(team, { name: 'uploader?' }, adminId);
    expect((await request(t.app).post(url(slug)).set('Authorization', `Bearer ${secret}`).attach('files', csv, 'a.csv')).status).toBe(403);
    expect((await request(t.app).post(url(slug)).set('Origin', ORIGIN).attach('files', csv, 'a.csv')).status).toBe(401);
    expect((await upload(otherTeamAdmin, slug).attach('files', csv, 'a.csv')).status).toBe(404);
    expect((await upload(animator, 'no-such-pack').attach('files', csv, 'a.csv')).status).toBe(404);
    expect(await curvesOf(slug)).toEqual([]);
  });

  it('an archived pack takes no uploads (409)', async () => {
    const slug = await freshPack();
    await request(t.app).patch(`/api/teams/${team}/packs/${slug}`).set('Cookie', animator).set('Origin', ORIGIN).send({ archived: true });
    const res = await upload(animator, slug).attach('files', Buffer.from(smoothCsv), 'a.csv');
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('pack_archived');
  });
});
