/**
 * `npm test`: type check, then vitest (unit, integration, API) and Playwright
 * (e2e in Debian's chromium) against throwaway services started here — a
 * PostgreSQL cluster in a temporary folder, the S3 fake and the mail catcher
 * on free loopback ports — torn down at the end. Exits non-zero on any failure
 * and ends with the plain line "N passed, N failed".
 *
 *   npm test                    everything
 *   npm test -- --only unit     skip the e2e suite (also: --only e2e, --skip-typecheck)
 *   npm test -- --only e2e e2e/editor.e2e.ts   only those Playwright files
 *   npm test -- tests/unit/curve  extra arguments go to vitest
 */
import { spawn } from 'node:child_process';
import { chmodSync, mkdtempSync, readFileSync, rmSync, existsSync, mkdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import pg from 'pg';
import { startEmbeddedPostgres } from './services/postgres';
import { freePort } from './services/free-port';
import { startS3Fake } from '../storage-fake/s3';
import { startMailCatcher } from '../storage-fake/mail-catcher';
import { createSequelize } from '../server/db/sequelize';
import { migrate } from '../server/db/migrate';
import { TEMPLATE_DB } from '../tests/support/names';

const root = resolve(import.meta.dirname, '..');
const bin = (name: string) => join(root, 'node_modules', '.bin', name);
const args = process.argv.slice(2);
const only = args.includes('--only') ? args[args.indexOf('--only') + 1] : undefined;
const skipTypecheck = args.includes('--skip-typecheck');
const restArgs = args.filter((a, i) => a !== '--' && a !== '--only' && args[i - 1] !== '--only' && a !== '--skip-typecheck');
/** `npm test -- --only e2e e2e/editor.e2e.ts` runs just those Playwright files; other paths go to vitest. */
const e2eArgs = restArgs.filter((a) => a.endsWith('.e2e.ts'));
const vitestArgs = restArgs.filter((a) => !a.endsWith('.e2e.ts'));

function run(cmd: string, argv: string[], env: NodeJS.ProcessEnv = process.env): Promise<number> {
  return new Promise((resolveRun) => {
    console.log(`\n$ ${[cmd.replace(root + '/', ''), ...argv].join(' ')}`);
    const child = spawn(cmd, argv, { cwd: root, env, stdio: 'inherit' });
    child.on('exit', (code, signal) => resolveRun(code ?? (signal ? 1 : 0)));
  });
}

function waitForHttp(url: string, ms: number): Promise<void> {
  const until = Date.now() + ms;
  return new Promise((resolveWait, reject) => {
    const tick = async () => {
      try {
        const res = await fetch(url);
        if (res.status < 500 || res.status === 503) return resolveWait();
      } catch {
        /* not yet */
      }
      if (Date.now() > until) return reject(new Error(`${url} did not come up within ${ms} ms`));
      setTimeout(tick, 250);
    };
    void tick();
  });
}

interface Tally { passed: number; failed: number; skipped: number }
function readVitest(file: string): Tally {
  if (!existsSync(file)) return { passed: 0, failed: 0, skipped: 0 };
  const r = JSON.parse(readFileSync(file, 'utf8'));
  return { passed: r.numPassedTests ?? 0, failed: (r.numFailedTests ?? 0) + (r.numRuntimeErrorTestSuites ?? 0), skipped: (r.numPendingTests ?? 0) + (r.numTodoTests ?? 0) };
}
function readPlaywright(file: string): Tally {
  if (!existsSync(file)) return { passed: 0, failed: 0, skipped: 0 };
  const s = JSON.parse(readFileSync(file, 'utf8')).stats ?? {};
  return { passed: s.expected ?? 0, failed: (s.unexpected ?? 0) + (s.flaky ?? 0), skipped: s.skipped ?? 0 };
}

async function main(): Promise<number> {
  const failures: string[] = [];
  // one report folder per run, so runs side by side (several people on one machine) never read each other's counts
  mkdirSync(join(root, '.tmp'), { recursive: true });
  const reports = mkdtempSync(join(root, '.tmp', 'reports-'));

  if (!skipTypecheck && only !== 'e2e') {
    if ((await run(bin('tsc'), ['--noEmit', '-p', 'tsconfig.json'])) !== 0) failures.push('type check');
    if ((await run(bin('tsc'), ['--noEmit', '-p', 'tsconfig.shared.json'])) !== 0) failures.push('type check (shared/ without DOM or Node)');
  }

  const work = mkdtempSync(join(tmpdir(), 'tangentry-test-'));
  chmodSync(work, 0o755); // the postgres user must reach its data folder
  const pgServer = await startEmbeddedPostgres({ dataDir: join(work, 'pg'), database: TEMPLATE_DB, throwaway: true });
  // Ctrl-C or SIGTERM mid-run: stop the throwaway cluster and remove its folder before leaving
  for (const sig of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) {
    process.once(sig, () => {
      pgServer.stop();
      rmSync(work, { recursive: true, force: true });
      process.exit(130);
    });
  }
  const s3 = await startS3Fake({ directory: join(work, 's3'), bucket: 'tangentry-test' });
  const mail = await startMailCatcher({ directory: join(work, 'mail') });
  try {
    // the template database every test file clones (tests/support/database.ts)
    const seq = createSequelize(pgServer.url(TEMPLATE_DB), 2);
    await migrate(seq, pgServer.url(TEMPLATE_DB));
    await seq.close();

    const env: NodeJS.ProcessEnv = {
      ...process.env,
      NODE_ENV: 'test',
      LOG_LEVEL: 'silent',
      TEST_PG_ADMIN_URL: pgServer.url('postgres'),
      TEST_PG_URL_BASE: pgServer.url(''),
      S3_ENDPOINT: s3.endpoint,
      S3_ACCESS_KEY_ID: s3.accessKeyId,
      S3_SECRET_ACCESS_KEY: s3.secretAccessKey,
      S3_BUCKET: 'tangentry-test',
      SMTP_URL: mail.url,
      MAIL_CATCHER_DIR: mail.directory,
      TEST_WORK_DIR: work,
    };

    if (only !== 'e2e') {
      const code = await run(bin('vitest'), ['run', '--reporter=default', '--reporter=json', `--outputFile.json=${join(reports, 'vitest.json')}`, ...vitestArgs], env);
      if (code !== 0) failures.push('vitest');
    }

    if (only !== 'unit' && vitestArgs.length === 0) {
      if ((await run(bin('vite'), ['build', '--logLevel', 'warn'], env)) !== 0) failures.push('client build');
      else {
        const admin = new pg.Client({ connectionString: pgServer.url('postgres') });
        await admin.connect();
        await admin.query(`CREATE DATABASE tangentry_e2e TEMPLATE ${TEMPLATE_DB}`);
        await admin.end();
        const port = await freePort();
        const appEnv = { ...env, NODE_ENV: 'production', PORT: String(port), DATABASE_URL: pgServer.url('tangentry_e2e'), LOG_LEVEL: 'warn', TANGENTRY_EMBEDDED: 'true' };
        const app = spawn(bin('tsx'), ['server/main.ts'], { cwd: root, env: appEnv, stdio: ['ignore', 'inherit', 'inherit'] });
        try {
          await waitForHttp(`http://127.0.0.1:${port}/api/health`, 60_000);
          const code = await run(bin('playwright'), ['test', '--config', 'e2e/playwright.config.ts', ...e2eArgs], {
            ...env,
            E2E_BASE_URL: `http://127.0.0.1:${port}`,
            PLAYWRIGHT_JSON_OUTPUT_NAME: join(reports, 'playwright.json'),
          });
          if (code !== 0) failures.push('e2e');
        } catch (err) {
          console.error((err as Error).message);
          failures.push('e2e (server did not start)');
        } finally {
          // let the app close its pools before PostgreSQL goes away
          const exited = new Promise<void>((r) => (app.exitCode !== null ? r() : app.once('exit', () => r())));
          app.kill('SIGTERM');
          await Promise.race([exited, new Promise((r) => setTimeout(r, 10_000))]);
        }
      }
    }
  } finally {
    await s3.close().catch(() => undefined);
    await mail.close().catch(() => undefined);
    pgServer.stop();
    rmSync(work, { recursive: true, force: true });
  }

  const v = readVitest(join(reports, 'vitest.json'));
  const p = readPlaywright(join(reports, 'playwright.json'));
  const failed = v.failed + p.failed + failures.filter((f) => f !== 'vitest' && f !== 'e2e').length;
  console.log(`\nreports: ${reports.replace(root + '/', '')}`);
  console.log(`vitest: ${v.passed} passed, ${v.failed} failed; playwright: ${p.passed} passed, ${p.failed} failed`);
  if (failures.length) console.log(`Failed steps: ${failures.join(', ')}`);
  const summaryFailed = failures.length && failed === 0 ? failures.length : failed;
  console.log(`${v.passed + p.passed} passed, ${summaryFailed} failed`);
  return failures.length ? 1 : 0;
}

main().then(
  (code) => (process.exitCode = code),
  (err) => {
    console.error(err);
    process.exitCode = 1;
  },
);
