/**
 * Build-server API load benchmark: autocannon on loopback against the real app over a throwaway stack
 * (embedded PostgreSQL, the S3 fake), beside a bare Express static response measured in the same run.
 *
 *   npx tsx bench/api.bench.ts [--seconds 5] [--connections 10] [--write]      (npm run bench:api)
 *
 * Seeds the demo studio, proposes "menu-transitions" through the API (background bake), approves it as a
 * lead and releases it to "shipping", then measures for --seconds each (default 4, at most 15: the whole run stays near 40 s on a shared machine), with
 * --connections (default 10) and a service token:
 *   1. bare Express: express.static serving a file with the same bytes as the artifact (the floor);
 *   2. artifact download: GET /api/v1/…/versions/1/artifacts/handheld/binary → 200 (bytes from the bucket);
 *   3. artifact revalidation: the same with If-None-Match "<sha256>" → 304 (no bucket read);
 *   4. channel read: GET /api/v1/…/channels/shipping → 200 (the manifest).
 * Every answer must carry the expected status: any error, timeout or other status fails the run (exit 1).
 * The load generator runs in a worker thread (autocannon `workers: 1`) so it does not share the server's
 * event loop. With --write the table replaces the "## API" section of docs/benchmarks.md (machine noted).
 */
import { chmodSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { createHash } from 'node:crypto';
import { createRequire } from 'node:module';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { fileURLToPath } from 'node:url';
import express from 'express';
import { startEmbeddedPostgres } from '../scripts/services/postgres';
import { startS3Fake } from '../storage-fake/s3';
import { createSequelize } from '../server/db/sequelize';
import { migrate } from '../server/db/migrate';
import { loadConfig } from '../server/config';
import { createContext, closeContext } from '../server/context';
import { createApp } from '../server/app';
import { seedDemoIfEmpty } from '../server/seed/demo';
import { ensureBucket } from '../server/storage/s3-client';
import { hashPassword } from '../server/auth/password';
import { newUserId } from '../server/auth/auth.service';
import { insertUser } from '../server/auth/auth.repository';
import { addMember, findTeamBySlug, studioIdOfTeam } from '../server/teams/teams.repository';
import { createToken } from '../server/tokens/tokens.service';
import { stopAllJobs } from '../server/jobs/boss';

/** The part of autocannon's programmatic API used here (the package ships no type declarations). */
interface CannonResult {
  duration: number;
  requests: { total: number };
  latency: { p50: number; p99: number; max: number };
  throughput: { average: number };
  errors: number;
  timeouts: number;
  statusCodeStats: Record<string, { count: number }>;
}
type Cannon = (opts: { url: string; connections: number; duration: number; headers?: Record<string, string>; workers?: number }) => Promise<CannonResult>;
const autocannon = createRequire(import.meta.url)('autocannon') as Cannon;

const root = fileURLToPath(new URL('..', import.meta.url));
const args = process.argv.slice(2);
const opt = (name: string, fallback: number, max: number) => {
  const i = args.indexOf(name);
  const n = i >= 0 ? Number(args[i + 1]) : fallback;
  return Number.isFinite(n) && n > 0 ? Math.min(max, Math.round(n)) : fallback;
};
const SECONDS = opt('--seconds', 4, 15);
const CONNECTIONS = opt('--connections', 10, 100);
const WRITE = args.includes('--write');
const ORIGIN = 'http://127.0.0.1:3000';
const PACK = 'menu-transitions';
const PASSWORD = 'bench api password 1';

const listen = async (handler: Parameters<typeof createServer>[1]): Promise<{ server: Server; base: string }> => {
  const server = createServer(handler);
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  return { server, base: `http://127.0.0.1:${(server.address() as AddressInfo).port}` };
};

async function json<T>(res: Response, expected: number, what: string): Promise<T> {
  const body = await res.text();
  if (res.status !== expected) throw new Error(`${what} answered ${res.status} (expected ${expected}): ${body.slice(0, 300)}`);
  return JSON.parse(body) as T;
}

interface Row { name: string; expected: number; r: CannonResult; bytes: number }

async function main(): Promise<number> {
  const t0 = performance.now();
  const work = mkdtempSync(join(tmpdir(), 'tangentry-bench-api-'));
  chmodSync(work, 0o755); // the postgres user must reach its data folder
  const pg = await startEmbeddedPostgres({ dataDir: join(work, 'pg'), database: 'bench_api', throwaway: true });
  const s3 = await startS3Fake({ directory: join(work, 's3'), bucket: 'tangentry-bench' });
  const servers: Server[] = [];
  let ctx: ReturnType<typeof createContext> | null = null;
  try {
    const url = pg.url();
    const seq = createSequelize(url, 2);
    await migrate(seq, url);
    await seq.close();
    const config = loadConfig({
      ...process.env, NODE_ENV: 'production', LOG_LEVEL: 'silent', DATABASE_URL: url, PUBLIC_URL: ORIGIN, SMTP_URL: undefined,
      S3_ENDPOINT: s3.endpoint, S3_ACCESS_KEY_ID: s3.accessKeyId, S3_SECRET_ACCESS_KEY: s3.secretAccessKey, S3_BUCKET: 'tangentry-bench',
      API_V1_RATE_LIMIT: '100000000', TANGENTRY_DOWNLOAD_REDIRECT: 'off', TANGENTRY_WORKER: 'inline', TANGENTRY_JOBS_POLL_SECONDS: '0.5',
    });
    const mark = (what: string) => console.log(`set-up: ${what} at ${((performance.now() - t0) / 1000).toFixed(1)} s`);
    mark('PostgreSQL, S3 fake, migrations');
    ctx = createContext(config);
    await ensureBucket(ctx.s3, config.s3.bucket);
    await seedDemoIfEmpty(ctx);
    const api = await listen(createApp(ctx));
    servers.push(api.server);

    // a lead who proposes, approves and releases; a service token for the build server
    const team = (await findTeamBySlug('ui-motion'))!.id;
    const leadId = newUserId();
    const email = 'bench-api-lead@corvid-lantern.test';
    await insertUser({ id: leadId, email, name: 'Bench lead', passwordHash: await hashPassword(PASSWORD), studioId: await studioIdOfTeam(team) });
    await addMember(team, leadId, 'lead');
    const signIn = await fetch(`${api.base}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json', origin: ORIGIN }, body: JSON.stringify({ email, password: PASSWORD }) });
    await json(signIn, 200, 'sign-in');
    const cookie = signIn.headers.getSetCookie().find((c) => c.startsWith('tangentry_session='))!.split(';')[0]!;
    const asLead = (method: string, path: string, body?: object) =>
      fetch(`${api.base}${path}`, { method, headers: { cookie, origin: ORIGIN, 'content-type': 'application/json' }, body: body && JSON.stringify(body) });
    const packPath = `/api/teams/${team}/packs/${PACK}`;
    mark('seed, sign-in');
    const { bake } = await json<{ bake: { id: string } }>(await asLead('POST', `${packPath}/versions`, { changelog: 'bench' }), 202, 'propose');
    let version = 0;
    for (const until = Date.now() + 60_000; !version;) {
      const b = (await json<{ bake: { state: string; version: number | null; failure: unknown } }>(await asLead('GET', `${packPath}/bakes/${bake.id}`), 200, 'bake')).bake;
      if (b.state === 'failed') throw new Error(`bake failed: ${JSON.stringify(b.failure)}`);
      if (b.state === 'done') version = b.version!;
      else if (Date.now() > until) throw new Error('bake did not finish within 60 s');
      else await new Promise((r) => setTimeout(r, 200));
    }
    mark('bake');
    await json(await asLead('POST', `${packPath}/versions/${version}/reviews`, { decision: 'approve' }), 201, 'approve');
    await json(await asLead('PUT', `${packPath}/channels/shipping`, { version }), 200, 'release');
    const { secret } = await createToken(team, { name: 'bench build farm' }, leadId);
    const auth = { authorization: `Bearer ${secret}` };

    const v1 = `${api.base}/api/v1/teams/${team}/packs/${PACK}`;
    const channelUrl = `${v1}/channels/shipping`;
    const channel = await json<{ manifest: { targets: { target: string; artifacts: { format: string; sha256: string; size: number; url: string }[] }[] } }>(await fetch(channelUrl, { headers: auth }), 200, 'channel read');
    const artifact = channel.manifest.targets.find((t) => t.target === 'handheld')!.artifacts.find((a) => a.format === 'binary')!;
    const artifactUrl = `${api.base}${artifact.url}`;
    const bytes = new Uint8Array(await (await fetch(artifactUrl, { headers: auth })).arrayBuffer());
    if (createHash('sha256').update(bytes).digest('hex') !== artifact.sha256) throw new Error('the artifact does not hash to its manifest SHA-256');
    const channelBytes = (await (await fetch(channelUrl, { headers: auth })).arrayBuffer()).byteLength;

    // the floor: the same bytes from express.static on a bare app
    const staticDir = join(work, 'static');
    mkdirSync(staticDir);
    writeFileSync(join(staticDir, 'handheld.tgpk'), bytes);
    const bare = express();
    bare.use(express.static(staticDir));
    const floor = await listen(bare);
    servers.push(floor.server);
    const setupSeconds = (performance.now() - t0) / 1000;

    const load = loadavg()[0]!;
    const scenarios = [
      { name: 'bare Express static (same bytes)', url: `${floor.base}/handheld.tgpk`, headers: {}, expected: 200, bytes: bytes.length },
      { name: 'artifact download', url: artifactUrl, headers: auth, expected: 200, bytes: bytes.length },
      { name: 'artifact revalidation (If-None-Match)', url: artifactUrl, headers: { ...auth, 'if-none-match': `"${artifact.sha256}"` }, expected: 304, bytes: 0 },
      { name: 'channel read (manifest)', url: channelUrl, headers: auth, expected: 200, bytes: channelBytes },
    ];
    const rows: Row[] = [];
    for (const s of scenarios) {
      const r = await autocannon({ url: s.url, connections: CONNECTIONS, duration: SECONDS, headers: s.headers, workers: 1 });
      rows.push({ name: s.name, expected: s.expected, r, bytes: s.bytes });
      console.log(`${s.name}: ${(r.requests.total / r.duration).toFixed(0)} req/s, p50 ${r.latency.p50} ms, p99 ${r.latency.p99} ms, statuses ${JSON.stringify(Object.fromEntries(Object.entries(r.statusCodeStats).map(([k, v]) => [k, v.count])))}, errors ${r.errors}, timeouts ${r.timeouts}`);
    }

    const wrong = (row: Row) => row.r.errors + row.r.timeouts + Object.entries(row.r.statusCodeStats).reduce((n, [code, v]) => n + (Number(code) === row.expected ? 0 : v.count), 0);
    const machine = `${cpus().length} × ${cpus()[0]?.model.trim() ?? 'unknown CPU'} (nproc ${cpus().length}), Node ${process.version}, ${new Date().toISOString().slice(0, 10)}, 1-minute load average ${load.toFixed(2)} at the start`;
    const table = [
      `Machine: ${machine}. autocannon 9.0.0 on loopback, ${CONNECTIONS} connections, ${SECONDS} s per row, the load generator in a worker thread of the`,
      'same process as the servers (the app, the S3 fake and express.static; PostgreSQL is its own process); a service token on every /api/v1 request; the artifact is the Handheld binary pack of the demo pack',
      `"menu-transitions" (${bytes.length} bytes), the manifest ${channelBytes} bytes. The machine is shared, so compare rows of one run, not runs.`,
      '',
      '| request | status | requests/s | p50 | p99 | max | vs bare Express | errors (must be 0) |',
      '|---|---|---|---|---|---|---|---|',
      ...rows.map((row) => {
        const rps = row.r.requests.total / row.r.duration;
        const floorRps = rows[0]!.r.requests.total / rows[0]!.r.duration;
        return `| ${row.name} | ${row.expected} | ${rps.toFixed(0)} | ${row.r.latency.p50} ms | ${row.r.latency.p99} ms | ${row.r.latency.max} ms | ${(rps / floorRps * 100).toFixed(0)} % | ${wrong(row)} |`;
      }),
    ].join('\n');
    console.log(`\n${table}\n\nset-up ${setupSeconds.toFixed(1)} s, total ${((performance.now() - t0) / 1000).toFixed(1)} s`);

    const failures = rows.filter((row) => wrong(row) > 0 || row.r.requests.total === 0);
    if (failures.length) {
      console.error(`failed: ${failures.map((f) => `${f.name} (${wrong(f)} errors, timeouts or statuses other than ${f.expected})`).join('; ')}`);
      return 1;
    }
    if (WRITE) {
      const file = join(root, 'docs', 'benchmarks.md');
      const doc = readFileSync(file, 'utf8');
      const section = `## API\n\n\`npm run bench:api -- --seconds ${SECONDS} --connections ${CONNECTIONS} --write\` (bench/api.bench.ts).\n\n${table}\n`;
      const re = /## API\n[\s\S]*?(?=\n## |$)/;
      writeFileSync(file, re.test(doc) ? doc.replace(re, section) : `${doc.trimEnd()}\n\n${section}`);
      console.log('wrote the "API" section of docs/benchmarks.md');
    }
    return 0;
  } finally {
    await stopAllJobs();
    await Promise.all(servers.map((s) => new Promise((r) => { s.closeAllConnections(); s.close(r); })));
    if (ctx) await closeContext(ctx);
    await s3.close().catch(() => undefined);
    pg.stop();
    rmSync(work, { recursive: true, force: true });
  }
}

main().then(
  (code) => { process.exitCode = code; },
  (err) => { console.error(err); process.exitCode = 1; },
);
