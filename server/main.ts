/**
 * Start the API (and the client) in this process: migrations, demo seed, listen.
 * Used by scripts/start.ts and by the test harness; configuration from the
 * environment (server/config.ts).
 */
import { createServer, type Server } from 'node:http';
import { join } from 'node:path';
import type { RequestHandler } from 'express';
import { loadConfig, type Config } from './config';
import { createContext, closeContext, type AppContext } from './context';
import { migrate } from './db/migrate';
import { seedDemoIfEmpty } from './seed/demo';
import { createApp } from './app';
import { ensureBucket } from './storage/s3-client';
import { startJobs, stopJobs } from './jobs/boss';
import { createWebhookDispatcher } from './webhooks/dispatcher';
import { startSessionSweep } from './auth/session-sweep';
import { closeRateLimitPools } from './http/pg-rate-limit-store';

export interface RunningServer {
  ctx: AppContext;
  server: Server;
  url: string;
  close(): Promise<void>;
}

export async function startServer(
  config: Config,
  opts: { clientDir?: string; clientMiddleware?: RequestHandler; seed?: boolean; createBucket?: boolean } = {},
): Promise<RunningServer> {
  const ctx = createContext(config);
  const applied = await migrate(ctx.sequelize, config.databaseUrl);
  if (applied.length) ctx.logger.info({ applied }, 'migrations applied');
  if (opts.createBucket) await ensureBucket(ctx.s3, config.s3.bucket);
  if (opts.seed && (await seedDemoIfEmpty(ctx))) ctx.logger.info('demo scenario seeded');
  // pg-boss: this process queues bakes, and bakes them too unless TANGENTRY_WORKER=off (then `npm run worker` does)
  const jobs = await startJobs(ctx);
  ctx.logger.info({ worker: jobs.working ? 'inline' : 'off' }, 'background bakes ready');
  const app = createApp(ctx, { clientDir: opts.clientDir, clientMiddleware: opts.clientMiddleware });
  const server = createServer(app);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(config.port, config.host, () => resolve());
  });
  const webhooks = createWebhookDispatcher(ctx); // delivers webhooks from this process (server/webhooks/dispatcher.ts)
  const sessionSweep = startSessionSweep(ctx); // deletes expired sessions, one instance at a time (advisory lock)
  const addr = server.address();
  const port = typeof addr === 'object' && addr ? addr.port : config.port;
  return {
    ctx,
    server,
    url: `http://${config.host}:${port}`,
    async close() {
      // stop accepting, drop idle keep-alive sockets now and busy ones after a grace period
      const closed = new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeIdleConnections();
      setTimeout(() => server.closeAllConnections(), 2_000).unref();
      await webhooks.stop();
      await sessionSweep.stop();
      await closed;
      await stopJobs(ctx).catch((err) => ctx.logger.warn({ err: (err as Error).message }, 'pg-boss did not stop cleanly'));
      await closeContext(ctx);
      await closeRateLimitPools();
    },
  };
}

// `tsx server/main.ts`: serve with the environment as the only configuration (no embedded services).
if (import.meta.url === `file://${process.argv[1]}`) {
  const config = loadConfig();
  const running = await startServer(config, {
    clientDir: join(process.cwd(), 'dist', 'client'),
    seed: process.env.TANGENTRY_SEED !== 'false',
    createBucket: true,
  });
  running.ctx.logger.info({ url: running.url }, 'Tangentry is listening');
  const stop = () => void running.close().then(() => (process.exitCode = 0));
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
}
