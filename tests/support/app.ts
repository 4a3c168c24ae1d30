/**
 * A real app over real services for API tests: a fresh database, the S3 fake
 * and the mail catcher that `npm test` started. Returns the Express app
 * (not listening; drive it with supertest) and its context.
 */
import { loadConfig } from '../../server/config';
import { createContext, closeContext, type AppContext } from '../../server/context';
import { createApp } from '../../server/app';
import { freshDatabaseUrl } from './database';
import { seedDemoIfEmpty } from '../../server/seed/demo';
import { ensureBucket } from '../../server/storage/s3-client';

export async function testApp(opts: { label?: string; seed?: boolean; env?: NodeJS.ProcessEnv } = {}) {
  const databaseUrl = await freshDatabaseUrl(opts.label);
  const config = loadConfig({ ...process.env, NODE_ENV: 'test', LOG_LEVEL: 'silent', DATABASE_URL: databaseUrl, PUBLIC_URL: 'http://127.0.0.1:3000', ...opts.env });
  const ctx: AppContext = createContext(config);
  await ensureBucket(ctx.s3, config.s3.bucket);
  if (opts.seed) await seedDemoIfEmpty(ctx);
  const app = createApp(ctx);
  return { app, ctx, config, databaseUrl, close: () => closeContext(ctx) };
}
