// The pure parts of `cli pull` (cli/pull/): flags, artifact selection, download decisions, the state file,
// the atomic write, and the HTTP behaviour (retries, Retry-After, redirects) against a small HTTP server
// started here. Sources: Retry-After forms from RFC 9110 §10.2.3 (its example date "Fri, 31 Dec 1999 23:59:59
// GMT"); strong ETags compared as quoted strings per RFC 9110 §8.8.3; dropping Authorization on a
// cross-origin redirect follows the Fetch Standard's HTTP-redirect fetch (§4.4, "request's current URL's
// origin is not same origin" removes `Authorization`).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createServer, type IncomingMessage, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parsePullOptions } from '../../../cli/pull/options';
import { decide, safeFileName, selectFiles } from '../../../cli/pull/plan';
import { readState, serializeState, emptyState, STATE_FILE, writeState } from '../../../cli/pull/state';
import { writeFileAtomic } from '../../../cli/pull/atomic-write';
import { backoffMs, get, problemMessage, retryAfterMs } from '../../../cli/pull/http';
import { EXIT, PullError } from '../../../cli/pull/exit-codes';
import type { ManifestDto } from '../../../shared/schemas/api-v1';

const base = ['--server', 'https://tangentry.example.com', '--token', 'tgt_x', '--pack', 'menu-transitions', '--channel', 'shipping', '--target', 'handheld', '--format', 'binary', '--out', 'tables'];
const usageOf = (argv: string[], env = {}) => {
  try {
    parsePullOptions(argv, env);
  } catch (e) {
    expect(e).toBeInstanceOf(PullError);
    expect((e as PullError).exitCode).toBe(EXIT.usage);
    return (e as Error).message;
  }
  throw new Error('expected a usage error');
};

describe('pull flags', () => {
  it('reads repeated and comma-separated targets and formats, and the token from TANGENTRY_TOKEN', () => {
    const o = parsePullOptions([...base.filter((a) => a !== '--token' && a !== 'tgt_x'), '--target', 'mobile,handheld', '--format=json', '--json'], { TANGENTRY_TOKEN: 'tgt_env' });
    expect(o.token).toBe('tgt_env');
    expect(o.targets).toEqual(['handheld', 'mobile']);
    expect(o.formats).toEqual(['binary', 'json']);
    expect(o.json).toBe(true);
    expect(o.timeoutMs).toBe(30_000);
    expect(o.retries).toBe(2);
    expect(parsePullOptions(base.map((a, i, all) => (all[i - 1] === '--target' ? 'all' : a))).targets).toBe('all');
    // --token wins over the environment
    expect(parsePullOptions(base, { TANGENTRY_TOKEN: 'tgt_env' }).token).toBe('tgt_x');
  });

  it('names the flag in every usage error', () => {
    const without = (flag: string) => base.filter((a, i, all) => a !== flag && all[i - 1] !== flag);
    for (const f of ['--server', '--pack', '--channel', '--out']) expect(usageOf(without(f))).toBe(`${f} is required`);
    expect(usageOf(without('--target'))).toMatch(/^--target is required/);
    expect(usageOf(without('--token'))).toMatch(/^--token is required \(or set TANGENTRY_TOKEN/);
    expect(usageOf([...base, '--pack', 'x'])).toBe('--pack was given twice');
    expect(usageOf([...base, '--wat'])).toBe('unknown option --wat');
    expect(usageOf([...base, 'stray'])).toMatch(/unexpected argument "stray"/);
    expect(usageOf([...base.slice(0, -1)])).toBe('--out needs a value');
    expect(usageOf(base.map((a) => (a === 'menu-transitions' ? 'Menu Transitions' : a)))).toMatch(/^--pack: "Menu Transitions" is not valid/);
    expect(usageOf(base.map((a) => (a === 'https://tangentry.example.com' ? 'ftp://x' : a)))).toMatch(/^--server: must be an http/);
    expect(usageOf([...base, '--target', 'all'])).toBe('--target: "all" cannot be combined with names');
    expect(usageOf([...base, '--timeout', '0'])).toMatch(/^--timeout: "0" must be a number above 0/);
    expect(usageOf([...base, '--retries', '1.5'])).toMatch(/^--retries: "1.5" must be a whole number/);
  });
});

const art = (target: string, format: string, ext: string, sha = format.padEnd(64, '0').replace(/[^0-9a-f]/g, 'a')) => ({
  format, fileName: `${target}.${ext}`, mediaType: 'application/octet-stream', size: 10, sha256: sha, url: `/api/v1/teams/t/packs/p/versions/3/artifacts/${target}/${format}`,
});
const manifest: ManifestDto = {
  pack: 'menu-transitions', version: 3, state: 'approved', changelog: '', createdAt: '2026-01-01T00:00:00.000Z',
  source: { sha256: 'f'.repeat(64), size: 1, url: '/x' }, curves: ['a'],
  targets: [
    { name: 'Handheld', target: 'handheld', kernel: 'hermite', layout: 'uniform', encoding: 'unorm16', tolerance: { mode: 'absolute', value: 0.002 }, failures: [], artifacts: [art('handheld', 'json', 'json'), art('handheld', 'binary', 'tgpk')] },
    { name: 'Web', target: 'web', kernel: 'linear', layout: 'adaptive', encoding: 'f32', tolerance: { mode: 'absolute', value: 0.003 }, failures: [], artifacts: [art('web', 'json', 'json'), art('web', 'binary', 'tgpk'), art('web', 'css', 'css')] },
  ],
};
const notFoundOf = (f: () => unknown) => {
  try {
    f();
  } catch (e) {
    expect((e as PullError).exitCode).toBe(EXIT.notFound);
    return (e as Error).message;
  }
  throw new Error('expected not found');
};

describe('pull selection and decisions', () => {
  it('selects every named format of every named target that has it', () => {
    expect(selectFiles(manifest, 'all', ['css']).map((f) => f.fileName)).toEqual(['web.css']);
    expect(selectFiles(manifest, ['web', 'handheld'], ['binary', 'css']).map((f) => f.fileName)).toEqual(['web.tgpk', 'web.css', 'handheld.tgpk']);
    expect(selectFiles(manifest, ['handheld'], 'all').map((f) => `${f.target}/${f.format}`)).toEqual(['handheld/json', 'handheld/binary']);
  });

  it('says which target or format is not there (exit 4)', () => {
    expect(notFoundOf(() => selectFiles(manifest, ['console', 'web'], 'all'))).toBe('target not found: "console" is not in pack "menu-transitions" v3 (targets: handheld, web)');
    expect(notFoundOf(() => selectFiles(manifest, ['handheld'], ['css']))).toBe('format not found: no chosen target of pack "menu-transitions" v3 (handheld) has "css" (formats: json, binary)');
    expect(notFoundOf(() => selectFiles(manifest, ['handheld', 'web'], ['css']))).toBe('format not found: target "handheld" of pack "menu-transitions" v3 has none of "css" (formats: json, binary)');
  });

  it('refuses file names that are paths', () => {
    for (const bad of ['../evil', '/etc/passwd', 'a/b.json', '.hidden', STATE_FILE, 'x.tmp', '']) expect(safeFileName(bad), bad).toBe(false);
    expect(safeFileName('handheld-tight.tgpk')).toBe(true);
    const evil = { ...manifest, targets: [{ ...manifest.targets[0]!, artifacts: [{ ...art('handheld', 'json', 'json'), fileName: '../../x.json' }] }] };
    expect(() => selectFiles(evil, 'all', 'all')).toThrow(/not a plain file name/);
  });

  it('keeps a file whose bytes already hash to the manifest, else asks with If-None-Match of the bytes on disk', () => {
    const f = selectFiles(manifest, ['handheld'], ['json'])[0]!;
    expect(decide(f, f.sha256)).toEqual({ action: 'keep' });
    expect(decide(f, 'b'.repeat(64))).toEqual({ action: 'fetch', ifNoneMatch: `"${'b'.repeat(64)}"` });
    expect(decide(f, null)).toEqual({ action: 'fetch', ifNoneMatch: null });
  });
});

describe('pull state and atomic write', () => {
  let dir = '';
  beforeAll(() => { dir = mkdtempSync(join(tmpdir(), 'tangentry-pull-unit-')); });
  afterAll(() => { if (dir) rmSync(dir, { recursive: true, force: true }); });

  it('round-trips the state; another server or team keeps only the file entries; a broken file is a warning', async () => {
    const s = emptyState('https://a.example', 'team-1');
    s.channels['menu-transitions/shipping'] = { etag: '"abc"', body: { pack: 'menu-transitions', channel: 'shipping', version: 3, manifest } };
    s.files['handheld.json'] = { pack: 'menu-transitions', channel: 'shipping', version: 3, target: 'handheld', format: 'json', sha256: 'a'.repeat(64), size: 10 };
    await writeState(dir, s);
    expect((await readState(dir, 'https://a.example', 'team-1')).state).toEqual(s);
    const other = (await readState(dir, 'https://b.example', 'team-1')).state;
    expect(other.channels).toEqual({});
    expect(other.files).toEqual(s.files);
    writeFileSync(join(dir, STATE_FILE), '{ not json');
    const broken = await readState(dir, 'https://a.example', 'team-1');
    expect(broken.state).toEqual(emptyState('https://a.example', 'team-1'));
    expect(broken.warning).toMatch(/not a pull state/);
    expect(serializeState(s).endsWith('\n')).toBe(true);
  });

  it('replaces a file in one rename and leaves no temp file, also when the rename fails', async () => {
    writeFileSync(join(dir, 'a.bin'), 'old');
    await writeFileAtomic(dir, 'a.bin', new TextEncoder().encode('new'));
    expect(readFileSync(join(dir, 'a.bin'), 'utf8')).toBe('new');
    mkdirSync(join(dir, 'taken'));
    writeFileSync(join(dir, 'taken', 'inside'), 'x'); // rename(2) over a non-empty folder fails
    await expect(writeFileAtomic(dir, 'taken', new TextEncoder().encode('y'))).rejects.toThrow();
    expect(readdirSync(dir).filter((n) => n.endsWith('.tmp'))).toEqual([]);
    expect(readFileSync(join(dir, 'taken', 'inside'), 'utf8')).toBe('x');
  });
});

describe('pull HTTP', () => {
  let server: Server;
  let other: Server;
  let url = '';
  let otherUrl = '';
  const seen: { path: string; auth: string | undefined }[] = [];
  let flaky = 0;
  const handler = (req: IncomingMessage, res: import('node:http').ServerResponse) => {
    seen.push({ path: req.url ?? '', auth: req.headers.authorization });
    if (req.url === '/flaky' && flaky-- > 0) return void res.writeHead(503).end();
    if (req.url === '/limited' && flaky-- > 0) return void res.writeHead(429, { 'Retry-After': '0' }).end();
    if (req.url === '/away') return void res.writeHead(302, { Location: `${otherUrl}/bytes?sig=1` }).end();
    if (req.url === '/problem') return void res.writeHead(404, { 'Content-Type': 'application/problem+json' }).end(JSON.stringify({ type: 'about:blank', title: 'Not Found', status: 404, code: 'not_found', detail: 'Pack "x" has no channel "y".' }));
    res.writeHead(200, { 'Content-Type': 'application/octet-stream' }).end('bytes');
  };
  beforeAll(async () => {
    server = createServer(handler);
    other = createServer(handler);
    await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
    await new Promise<void>((r) => other.listen(0, 'localhost', r));
    url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    otherUrl = `http://localhost:${(other.address() as AddressInfo).port}`;
  });
  afterAll(async () => {
    await new Promise((r) => server.close(r));
    await new Promise((r) => other.close(r));
  });
  const sleeps: number[] = [];
  const deps = { fetch: globalThis.fetch, sleep: async (ms: number) => { sleeps.push(ms); } };
  const opts = { headers: { Authorization: 'Bearer tgt_secret' }, timeoutMs: 5000, retries: 2, what: 'thing' };

  it('reads Retry-After as seconds or an HTTP-date (RFC 9110 §10.2.3)', () => {
    expect(retryAfterMs('120')).toBe(120_000);
    expect(retryAfterMs('Fri, 31 Dec 1999 23:59:59 GMT', Date.UTC(1999, 11, 31, 23, 59, 49))).toBe(10_000);
    expect(retryAfterMs(null)).toBeNull();
    expect(retryAfterMs('soon')).toBeNull();
    expect([0, 1].map(backoffMs)).toEqual([300, 900]);
  });

  it('retries 503 and 429 (waiting Retry-After), then answers', async () => {
    sleeps.length = 0;
    flaky = 2;
    expect((await get(deps, `${url}/flaky`, opts)).status).toBe(200);
    expect(sleeps).toEqual([300, 900]);
    sleeps.length = 0;
    flaky = 1;
    expect((await get(deps, `${url}/limited`, opts)).status).toBe(200);
    expect(sleeps).toEqual([0]);
    flaky = 5;
    expect((await get(deps, `${url}/flaky`, { ...opts, retries: 1 })).status).toBe(503); // the caller maps it to exit 6
  });

  it('follows a redirect to another origin without the bearer token', async () => {
    seen.length = 0;
    const r = await get(deps, `${url}/away`, opts);
    expect(new TextDecoder().decode(r.body)).toBe('bytes');
    expect(seen).toEqual([{ path: '/away', auth: 'Bearer tgt_secret' }, { path: '/bytes?sig=1', auth: undefined }]);
  });

  it('a refused connection is a network failure (exit 6) after the retries', async () => {
    sleeps.length = 0;
    const closed = createServer();
    await new Promise<void>((r) => closed.listen(0, '127.0.0.1', r));
    const port = (closed.address() as AddressInfo).port;
    await new Promise((r) => closed.close(r));
    const err = await get(deps, `http://127.0.0.1:${port}/x`, opts).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(PullError);
    expect((err as PullError).exitCode).toBe(EXIT.network);
    expect((err as Error).message).toMatch(/ECONNREFUSED.*after 3 attempts/);
    expect(sleeps).toEqual([300, 900]);
  });

  it('turns an RFC 9457 problem into "code: detail"', async () => {
    const r = await get(deps, `${url}/problem`, opts);
    expect(problemMessage(r.status, r.headers, r.body)).toBe('not_found: Pack "x" has no channel "y".');
  });
});
