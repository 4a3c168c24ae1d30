/**
 * `npm start` / `npm run dev`: bring up whatever is not configured as a real
 * service — PostgreSQL under .data/postgres, the S3 fake under .data/storage,
 * the mail catcher under .data/mail — then migrate, seed the demo scenario into
 * an empty database, build the client (start) or attach Vite (dev), and serve
 * everything from one Express process. Ctrl-C / SIGTERM stops all it started.
 */
import { join, resolve } from 'node:path';
import { loadConfig, ConfigError } from '../server/config';
import { startServer, type RunningServer } from '../server/main';
import { startEmbeddedPostgres, type EmbeddedPostgres } from './services/postgres';
import { startS3Fake, type S3Fake } from '../storage-fake/s3';
import { startMailCatcher, type MailCatcher } from '../storage-fake/mail-catcher';
import { DEMO_PASSWORD_NOTE } from './demo-accounts';
import { preferPort } from './services/free-port';

const root = resolve(import.meta.dirname, '..');
const dataDir = join(root, '.data');
const dev = process.env.TANGENTRY_MODE === 'dev';

const started: { pg?: EmbeddedPostgres; s3?: S3Fake; mail?: MailCatcher; server?: RunningServer } = {};
let stopping = false;

async function stopAll(code: number): Promise<void> {
  if (stopping) return;
  stopping = true;
  console.log('\nStopping Tangentry …');
  await started.server?.close().catch((e) => console.error('server:', e.message));
  await started.s3?.close().catch((e) => console.error('storage fake:', e.message));
  await started.mail?.close().catch((e) => console.error('mail catcher:', e.message));
  started.pg?.stop();
  process.exitCode = code;
}

async function main(): Promise<void> {
  const env: NodeJS.ProcessEnv = { ...process.env, NODE_ENV: process.env.NODE_ENV ?? (dev ? 'development' : 'production') };
  // Check what the person configured before starting anything (names the bad variable).
  loadConfig({ DATABASE_URL: 'postgres://placeholder/db', ...env });

  if (!env.DATABASE_URL) {
    started.pg = await startEmbeddedPostgres({ dataDir: join(dataDir, 'postgres'), database: 'tangentry', port: Number(env.PG_PORT) || (await preferPort(54329)) });
    env.DATABASE_URL = started.pg.url();
    env.TANGENTRY_EMBEDDED = 'true'; // demo accounts only on the embedded database (server/config.ts)
    console.log(`PostgreSQL (embedded) on 127.0.0.1:${started.pg.port}, data in .data/postgres`);
  }
  if (!env.S3_ENDPOINT) {
    started.s3 = await startS3Fake({ directory: join(dataDir, 'storage'), bucket: env.S3_BUCKET ?? 'tangentry-library' });
    Object.assign(env, { S3_ENDPOINT: started.s3.endpoint, S3_ACCESS_KEY_ID: started.s3.accessKeyId, S3_SECRET_ACCESS_KEY: started.s3.secretAccessKey });
    console.log(`S3 fake on ${started.s3.endpoint}, data in .data/storage`);
  }
  if (!env.SMTP_URL) {
    started.mail = await startMailCatcher({ directory: join(dataDir, 'mail') });
    Object.assign(env, { SMTP_URL: started.mail.url, MAIL_CATCHER_DIR: started.mail.directory });
    console.log(`Mail catcher on ${started.mail.url}, messages in .data/mail (shown on the outbox page)`);
  }
  const config = loadConfig(env);

  let clientMiddleware;
  if (dev) {
    const { createServer } = await import('vite');
    const vite = await createServer({ root, server: { middlewareMode: true }, appType: 'spa' });
    clientMiddleware = vite.middlewares;
  } else {
    console.log('Building the client …');
    const { build } = await import('vite');
    await build({ root, logLevel: 'warn' });
  }
  started.server = await startServer(config, {
    clientDir: dev ? undefined : join(root, 'dist', 'client'),
    clientMiddleware,
    seed: true,
    createBucket: true,
  });
  console.log(`\nTangentry is running at ${started.server.url}${dev ? ' (dev, hot reload)' : ''}`);
  if (config.demoAccounts) console.log(DEMO_PASSWORD_NOTE);
  console.log('Press Ctrl-C to stop.');
}

for (const sig of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) process.on(sig, () => void stopAll(0));
// Whatever ends the process (Vite's own SIGTERM handler in dev calls process.exit), PostgreSQL is stopped:
// stop() is synchronous, so it runs inside the exit hook.
process.on('exit', () => started.pg?.stop());

main().catch(async (err) => {
  if (err instanceof ConfigError) console.error(err.message);
  else console.error('Tangentry could not start:', err instanceof Error ? err.stack : err);
  await stopAll(1);
});
