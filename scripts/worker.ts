/**
 * `npm run worker`: a bake worker without the API — pg-boss on DATABASE_URL working the bake queue, storing
 * into the configured S3 bucket. Configured only by the environment (server/config.ts), like
 * `tsx server/main.ts`; run as many as you like beside API processes started with TANGENTRY_WORKER=off.
 * Migrations run first (under their advisory lock, so starting together with the API is safe).
 * SIGINT/SIGTERM stop it gracefully: a running bake gets up to 10 s, then its job is failed and retried
 * by another worker; SIGKILL leaves the job active until pg-boss expires it (TANGENTRY_BAKE_EXPIRE_SECONDS).
 */
import { loadConfig, ConfigError } from '../server/config';
import { createContext, closeContext, type AppContext } from '../server/context';
import { migrate } from '../server/db/migrate';
import { startJobs, stopJobs } from '../server/jobs/boss';

let ctx: AppContext | undefined;
let stopping = false;

async function stop(code: number): Promise<void> {
  if (stopping) return;
  stopping = true;
  if (ctx) {
    ctx.logger.info('bake worker stopping');
    await stopJobs(ctx).catch((err) => ctx!.logger.warn({ err: (err as Error).message }, 'pg-boss did not stop cleanly'));
    await closeContext(ctx).catch(() => undefined);
  }
  process.exitCode = code;
}

async function main(): Promise<void> {
  const config = loadConfig();
  ctx = createContext(config);
  const applied = await migrate(ctx.sequelize, config.databaseUrl);
  if (applied.length) ctx.logger.info({ applied }, 'migrations applied');
  await startJobs(ctx, { work: true });
  ctx.logger.info({ pid: process.pid }, 'bake worker ready');
  if (process.send) process.send({ ready: true }); // a parent that forked us (tests) learns we are up
  console.log('Tangentry bake worker is running. Press Ctrl-C to stop.');
}

for (const sig of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) process.on(sig, () => void stop(0));

main().catch(async (err) => {
  if (err instanceof ConfigError) console.error(err.message);
  else console.error('The bake worker could not start:', err instanceof Error ? err.stack : err);
  await stop(1);
});
