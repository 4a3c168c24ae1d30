// `cli pull` against the real server listening on an ephemeral loopback port, over the real PostgreSQL and
// the S3 fake. Data goes in through the API (create a pack and curves, propose, approve as lead, release a
// channel). Every request the server receives is counted by a wrapper around the Express app, so "the second
// pull downloads nothing" is checked on the server side. Independent checks: the SHA-256 of each written file
// is computed here with node:crypto and compared with the manifest and with the bytes of the object read
// back from the bucket through @aws-sdk/client-s3; conditional requests follow RFC 9110 §13.1.2 (If-None-Match).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { GetObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import { testApp } from '../support/app';
import { ORIGIN, createPerson, signIn, teamId, uniqueEmail } from '../support/accounts';
import { proposeAndWait } from '../support/bakes';
import { createToken } from '../../server/tokens/tokens.service';
import { runPull } from '../../cli/pull/run';
import { STATE_FILE } from '../../cli/pull/state';
import type { CurveDocument, Key } from '../../shared/curve';
import type { ManifestDto } from '../../shared/schemas/api-v1';

const PASSWORD = 'pull password 1';
const ROOT = resolve(__dirname, '../..');
const PACK = 'build-pull';

const key = (time: number, value: number): Key => ({ time, value, slopeIn: 0, slopeOut: 0, rule: 'manual', slopes: 'joined' });
const doc = (name: string, top: number): CurveDocument => ({
  format: 'tangentry.curve', version: 1, name, units: { time: 's', value: 'progress' }, before: 'clamp', after: 'clamp', frameRate: 60,
  drives: 'position', tags: [], keys: [key(0, 0), key(0.5, top), key(1, 1)], segments: [{ kind: 'hermite' }, { kind: 'linear' }],
});
const sha256 = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

interface Seen { method: string; path: string; status: number }

/** Starts the app on 127.0.0.1:<ephemeral>; `seen` lists every request with the status it got. */
async function listen(app: (req: never, res: never) => void): Promise<{ server: Server; url: string; seen: Seen[] }> {
  const seen: Seen[] = [];
  const server = createServer((req, res) => {
    res.on('finish', () => seen.push({ method: req.method ?? '', path: (req.url ?? '').split('?')[0]!, status: res.statusCode }));
    (app as unknown as (q: typeof req, s: typeof res) => void)(req, res);
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  return { server, url: `http://127.0.0.1:${(server.address() as AddressInfo).port}`, seen };
}

async function pull(args: string[], env: Record<string, string | undefined> = {}) {
  let stdout = '';
  let stderr = '';
  const code = await runPull(args, { stdout: (t) => { stdout += t; }, stderr: (t) => { stderr += t; }, env });
  return { code, stdout, stderr };
}

describe('cli pull against the real server', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let http: Awaited<ReturnType<typeof listen>>;
  let team = '';
  let animator = '';
  let lead = '';
  let token = '';
  let out = '';
  const files = ['handheld.json', 'handheld.tgpk', 'mobile.json', 'mobile.tgpk'];

  const base = () => `/api/teams/${team}/packs/${PACK}`;
  const post = (cookie: string, url: string, body: object) => request(t.app).post(url).set('Cookie', cookie).set('Origin', ORIGIN).send(body);
  /** propose (background bake) → approve as lead → release `shipping`; returns the version number */
  async function release(changelog: string): Promise<number> {
    const { version } = await proposeAndWait(t.app, animator, team, PACK, changelog);
    expect((await post(lead, `${base()}/versions/${version.number}/reviews`, { decision: 'approve' })).status).toBe(201);
    const moved = await request(t.app).put(`${base()}/channels/shipping`).set('Cookie', lead).set('Origin', ORIGIN).send({ version: version.number });
    expect(moved.status, JSON.stringify(moved.body)).toBe(200);
    return version.number;
  }
  async function manifest(): Promise<ManifestDto> {
    const res = await request(t.app).get(`/api/v1/teams/${team}/packs/${PACK}/channels/shipping`).set('Authorization', `Bearer ${token}`);
    expect(res.status).toBe(200);
    return res.body.manifest as ManifestDto;
  }
  const artifact = (m: ManifestDto, file: string) => m.targets.flatMap((x) => x.artifacts).find((a) => a.fileName === file)!;
  const args = (...extra: string[]) => ['--server', http.url, '--token', token, '--pack', PACK, '--channel', 'shipping', '--target', 'handheld,mobile', '--format', 'json', '--format', 'binary', '--out', out, ...extra];

  beforeAll(async () => {
    t = await testApp({ label: 'pull', seed: true });
    team = await teamId('ui-motion');
    const cookies: string[] = [];
    let adminId = '';
    for (const role of ['animator', 'lead', 'admin'] as const) {
      const email = uniqueEmail(`pull-${role}`);
      const id = await createPerson({ email, password: PASSWORD, teams: { 'ui-motion': role } });
      if (role === 'admin') adminId = id;
      cookies.push(await signIn(t.app, email, PASSWORD));
    }
    [animator, lead] = cookies as [string, string];
    token = (await createToken(team, { name: 'pull test farm' }, adminId)).secret;
    expect((await post(animator, `/api/teams/${team}/packs`, { name: 'Build pull' })).status).toBe(201);
    expect((await post(animator, `${base()}/curves`, { document: doc('panel-in', 0.7) })).status).toBe(201);
    http = await listen(t.app as never);
    out = mkdtempSync(join(tmpdir(), 'tangentry-pull-'));
  });
  afterAll(async () => {
    await new Promise((r) => http?.server.close(r));
    if (out) rmSync(out, { recursive: true, force: true });
    await t?.close();
  });

  it('first pull downloads each file; its SHA-256 matches the manifest and the object in the bucket', async () => {
    expect(await release('first')).toBe(1);
    const r = await pull(args());
    expect(r.code, r.stderr).toBe(0);
    const m = await manifest();
    for (const f of files) {
      const bytes = readFileSync(join(out, f));
      const a = artifact(m, f);
      expect(sha256(bytes)).toBe(a.sha256);
      expect(bytes.length).toBe(a.size);
      const stored = await t.ctx.s3.send(new GetObjectCommand({ Bucket: t.config.s3.bucket, Key: `sha256/${a.sha256}` }));
      expect(Buffer.from(await stored.Body!.transformToByteArray()).equals(bytes)).toBe(true);
    }
    expect(r.stdout.trim().split('\n')).toHaveLength(4);
    expect(r.stdout).toMatch(/^downloaded +handheld\.json +handheld\/json +v1 /m);
    expect(readdirSync(out).sort()).toEqual([STATE_FILE, ...files].sort()); // no temp file left
    expect(http.seen.filter((s) => s.path.includes('/artifacts/')).map((s) => s.status)).toEqual([200, 200, 200, 200]);
  });

  it('second pull downloads nothing: the channel read answers 304, no artifact is requested, no file is touched', async () => {
    const mtimes = [...files, STATE_FILE].map((f) => statSync(join(out, f)).mtimeMs);
    http.seen.length = 0;
    const r = await pull([...args(), '--json']);
    expect(r.code, r.stderr).toBe(0);
    const report = JSON.parse(r.stdout);
    expect(report).toMatchObject({ ok: true, exitCode: 0, pack: PACK, channel: 'shipping', version: 1, team });
    expect(report.files.map((f: { file: string; action: string }) => [f.file, f.action])).toEqual(files.map((f) => [f, 'unchanged']));
    expect(http.seen.filter((s) => s.path.includes('/artifacts/'))).toEqual([]);
    expect(http.seen.find((s) => s.path.endsWith('/channels/shipping'))?.status).toBe(304);
    expect([...files, STATE_FILE].map((f) => statSync(join(out, f)).mtimeMs)).toEqual(mtimes);
  });

  it('after the channel moves to a new version, the pull fetches the changed files', async () => {
    const before = Object.fromEntries(files.map((f) => [f, sha256(readFileSync(join(out, f)))]));
    expect((await post(animator, `${base()}/curves`, { document: doc('panel-out', 0.2) })).status).toBe(201);
    expect(await release('second: panel-out')).toBe(2);
    http.seen.length = 0;
    const r = await pull(args('--team', 'ui-motion')); // a slug, resolved through whoami
    expect(r.code, r.stderr).toBe(0);
    const m = await manifest();
    expect(m.version).toBe(2);
    for (const f of files) {
      const now = sha256(readFileSync(join(out, f)));
      expect(now).toBe(artifact(m, f).sha256);
      expect(now).not.toBe(before[f]);
    }
    expect(r.stdout).toMatch(/^downloaded +handheld\.tgpk +handheld\/binary +v2 \(was v1\)/m);
    expect(http.seen.filter((s) => s.path.includes('/artifacts/')).map((s) => s.path.split('/').slice(-4).join('/'))).toEqual(
      ['2/artifacts/handheld/json', '2/artifacts/handheld/binary', '2/artifacts/mobile/json', '2/artifacts/mobile/binary'],
    );
    const state = JSON.parse(readFileSync(join(out, STATE_FILE), 'utf8'));
    expect(state.files['mobile.tgpk']).toMatchObject({ version: 2, sha256: artifact(m, 'mobile.tgpk').sha256 });
  });

  it('a tampered object in the bucket is refused with exit 5; the old files stay and no temp file is left', async () => {
    const kept = Object.fromEntries(files.map((f) => [f, readFileSync(join(out, f))]));
    expect((await post(animator, `${base()}/curves`, { document: doc('panel-pop', 0.95) })).status).toBe(201);
    expect(await release('third: panel-pop')).toBe(3);
    const victim = artifact(await manifest(), 'mobile.tgpk');
    const good = await t.ctx.s3.send(new GetObjectCommand({ Bucket: t.config.s3.bucket, Key: `sha256/${victim.sha256}` }));
    const forged = new Uint8Array(await good.Body!.transformToByteArray());
    forged[forged.length - 1] ^= 0xff; // same size, one byte different
    await t.ctx.s3.send(new PutObjectCommand({ Bucket: t.config.s3.bucket, Key: `sha256/${victim.sha256}`, Body: forged, ContentLength: forged.length }));

    const r = await pull(args());
    expect(r.code).toBe(5);
    expect(r.stderr).toMatch(/mobile\.tgpk: checksum mismatch/);
    expect(r.stderr).toContain(victim.sha256);
    // handheld.* of v3 arrived fine, but nothing is written while any file fails: the folder stays on v2
    for (const f of files) expect(readFileSync(join(out, f)).equals(kept[f]!)).toBe(true);
    expect(readdirSync(out).sort()).toEqual([STATE_FILE, ...files].sort());
    expect(JSON.parse(readFileSync(join(out, STATE_FILE), 'utf8')).files['mobile.tgpk'].version).toBe(2);
  });

  it('a wrong or revoked token exits 3 (whoami and the channel read both refuse it)', async () => {
    const wrong = token.slice(0, -1) + (token.endsWith('A') ? 'B' : 'A');
    const viaWhoami = await pull(args().map((a) => (a === token ? wrong : a)));
    expect(viaWhoami.code).toBe(3);
    expect(viaWhoami.stderr).toMatch(/whoami: authentication failed \(401 unauthenticated/);
    const viaChannel = await pull([...args().map((a) => (a === token ? wrong : a)), '--team', team]);
    expect(viaChannel.code).toBe(3);
    expect(viaChannel.stderr).toMatch(/channel "shipping" of pack "build-pull": authentication failed \(401/);
  });

  it('an unknown pack, channel, target or format exits 4 and says which', async () => {
    const swap = (flag: string, value: string) => {
      const a = args();
      a[a.indexOf(flag) + 1] = value;
      return a;
    };
    const pack = await pull(swap('--pack', 'no-such-pack'));
    expect(pack.code).toBe(4);
    expect(pack.stderr).toMatch(/pack "no-such-pack": not found \(404 not_found: .*no-such-pack/);
    const channel = await pull(swap('--channel', 'nightly'));
    expect(channel.code).toBe(4);
    expect(channel.stderr).toMatch(/not found \(404 not_found: Pack "build-pull" has no channel "nightly"/);
    const target = await pull(swap('--target', 'handheld-tight,mobile'));
    expect(target.code).toBe(4);
    expect(target.stderr).toMatch(/target not found: "handheld-tight" is not in pack "build-pull" v3 \(targets: console, handheld, mobile, web\)/);
    const format = await pull(swap('--format', 'css'));
    expect(format.code).toBe(4);
    expect(format.stderr).toMatch(/format not found: no chosen target of pack "build-pull" v3 \(handheld, mobile\) has "css" \(formats: json, binary/);
  });

  it('a server that is down exits 6 after retrying', async () => {
    const closed = createServer();
    await new Promise<void>((r) => closed.listen(0, '127.0.0.1', r));
    const port = (closed.address() as AddressInfo).port;
    await new Promise((r) => closed.close(r));
    const a = args();
    a[a.indexOf('--server') + 1] = `http://127.0.0.1:${port}`;
    const r = await pull([...a, '--retries', '1']);
    expect(r.code).toBe(6);
    expect(r.stderr).toMatch(/network failure reaching http:\/\/127\.0\.0\.1:\d+ \(ECONNREFUSED\) after 2 attempts/);
  });

  it('bad flags exit 2 and name the flag', async () => {
    const noPack = await pull(args().filter((a, i, all) => a !== '--pack' && all[i - 1] !== '--pack'));
    expect(noPack.code).toBe(2);
    expect(noPack.stderr).toMatch(/--pack is required/);
    const badServer = await pull(args().map((a) => (a === http.url ? 'not a url' : a)));
    expect(badServer.code).toBe(2);
    expect(badServer.stderr).toMatch(/--server: "not a url" is not a URL/);
    const unknown = await pull([...args(), '--verbose']);
    expect(unknown.code).toBe(2);
    expect(unknown.stderr).toMatch(/unknown option --verbose/);
    const noToken = await pull(args().filter((a, i, all) => a !== '--token' && all[i - 1] !== '--token'));
    expect(noToken.code).toBe(2);
    expect(noToken.stderr).toMatch(/--token is required \(or set TANGENTRY_TOKEN/);
  });

  it('`npx tsx cli/index.ts pull` exits with the real code; the token can come from TANGENTRY_TOKEN', async () => {
    const run = (argv: string[], env: NodeJS.ProcessEnv) => new Promise<{ code: number | null; stdout: string; stderr: string }>((res) => {
      const child = spawn('npx', ['tsx', 'cli/index.ts', 'pull', ...argv], { cwd: ROOT, env: { ...process.env, ...env } });
      let stdout = '';
      let stderr = '';
      child.stdout.on('data', (d) => { stdout += d; });
      child.stderr.on('data', (d) => { stderr += d; });
      child.on('close', (code) => res({ code, stdout, stderr }));
    });
    const fresh = mkdtempSync(join(tmpdir(), 'tangentry-pull-spawn-'));
    try {
      // handheld and web only: mobile's binary is the tampered object of the test above
      const a = ['--server', http.url, '--pack', PACK, '--channel', 'shipping', '--target', 'handheld', '--target', 'web', '--format', 'json', '--format', 'css', '--out', fresh];
      const ok = await run(a, { TANGENTRY_TOKEN: token });
      expect(ok.code, ok.stderr).toBe(0);
      expect(ok.stdout).toMatch(/^downloaded +web\.css +web\/css +v3 /m);
      expect(readdirSync(fresh).sort()).toEqual([STATE_FILE, 'handheld.json', 'web.css', 'web.json'].sort());
      expect(readFileSync(join(fresh, 'web.css'), 'utf8')).toMatch(/linear\(/);
      const bad = await run(a, { TANGENTRY_TOKEN: 'tgt_nonsense' });
      expect(bad.code).toBe(3);
    } finally {
      rmSync(fresh, { recursive: true, force: true });
    }
  }, 60_000);
});

describe('cli pull with presigned S3 redirects', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let http: Awaited<ReturnType<typeof listen>>;
  let out = '';
  afterAll(async () => {
    await new Promise((r) => http?.server.close(r));
    if (out) rmSync(out, { recursive: true, force: true });
    await t?.close();
  });

  it('follows the 302 to the bucket, checks the bytes, and the second pull asks nothing', async () => {
    t = await testApp({ label: 'pull-presigned', seed: true, env: { TANGENTRY_DOWNLOAD_REDIRECT: 'presigned' } });
    const team = await teamId('ui-motion');
    const cookies: string[] = [];
    let leadId = '';
    for (const role of ['animator', 'lead'] as const) {
      const email = uniqueEmail(`pull-presigned-${role}`);
      const id = await createPerson({ email, password: PASSWORD, teams: { 'ui-motion': role } });
      if (role === 'lead') leadId = id;
      cookies.push(await signIn(t.app, email, PASSWORD));
    }
    const [animator, lead] = cookies as [string, string];
    const base = `/api/teams/${team}/packs/${PACK}`;
    expect((await request(t.app).post(`/api/teams/${team}/packs`).set('Cookie', animator).set('Origin', ORIGIN).send({ name: 'Build pull' })).status).toBe(201);
    expect((await request(t.app).post(`${base}/curves`).set('Cookie', animator).set('Origin', ORIGIN).send({ document: doc('panel-in', 0.6) })).status).toBe(201);
    const { version } = await proposeAndWait(t.app, animator, team, PACK, 'first');
    expect((await request(t.app).post(`${base}/versions/${version.number}/reviews`).set('Cookie', lead).set('Origin', ORIGIN).send({ decision: 'approve' })).status).toBe(201);
    expect((await request(t.app).put(`${base}/channels/shipping`).set('Cookie', lead).set('Origin', ORIGIN).send({ version: version.number })).status).toBe(200);
    const { secret } = await createToken(team, { name: 'presigned farm' }, leadId);
    http = await listen(t.app as never);
    out = mkdtempSync(join(tmpdir(), 'tangentry-pull-presigned-'));
    const argv = ['--server', http.url, '--pack', PACK, '--channel', 'shipping', '--target', 'handheld', '--format', 'binary', '--out', out, '--json'];

    const first = await pull(argv, { TANGENTRY_TOKEN: secret });
    expect(first.code, first.stderr).toBe(0);
    const artifactHits = http.seen.filter((s) => s.path.includes('/artifacts/'));
    expect(artifactHits.map((s) => s.status)).toEqual([302]); // the bytes came from the bucket, not the app
    const file = JSON.parse(first.stdout).files[0];
    expect(file).toMatchObject({ file: 'handheld.tgpk', action: 'downloaded' });
    const bytes = readFileSync(join(out, 'handheld.tgpk'));
    expect(sha256(bytes)).toBe(file.sha256);
    const stored = await t.ctx.s3.send(new GetObjectCommand({ Bucket: t.config.s3.bucket, Key: `sha256/${file.sha256}` }));
    expect(Buffer.from(await stored.Body!.transformToByteArray()).equals(bytes)).toBe(true);

    http.seen.length = 0;
    const second = await pull(argv, { TANGENTRY_TOKEN: secret });
    expect(second.code, second.stderr).toBe(0);
    expect(JSON.parse(second.stdout).files[0].action).toBe('unchanged');
    expect(http.seen.filter((s) => s.path.includes('/artifacts/'))).toEqual([]);
  });
});
