import type { Sequelize } from 'sequelize';
import type { S3Client } from '@aws-sdk/client-s3';
import type { Transporter } from 'nodemailer';
import type { Logger } from 'pino';
import pg from 'pg';
import type { Config } from './config';
import { createSequelize } from './db/sequelize';
import { initModels } from './models';
import { createS3Client } from './storage/s3-client';
import { createMailTransport } from './mail/transport';
import { createLogger } from './logger';
import { TeamEvents } from './events/team-events';
import { registerSubscribers } from './events/subscribers';
import { startMailOutbox, stopMailOutbox } from './mail/outbox';

/** What every route and service needs, made once per process and passed down (no globals to import). */
export interface AppContext {
  config: Config;
  logger: Logger;
  sequelize: Sequelize;
  s3: S3Client;
  mail: Transporter | null;
  /** A small pg pool for lucia's session adapter (server/auth/lucia.ts). */
  pgPool: pg.Pool;
  /** Team events (server/events/team-events.ts): routes publish, the activity log, notifications and webhooks listen. */
  events: TeamEvents;
}

export function createContext(config: Config, logger: Logger = createLogger(config.logLevel)): AppContext {
  const sequelize = createSequelize(config.databaseUrl, config.databasePoolMax);
  initModels(sequelize);
  const pgPool = new pg.Pool({ connectionString: config.databaseUrl, max: Math.max(2, Math.ceil(config.databasePoolMax / 2)), idleTimeoutMillis: 10_000 });
  pgPool.on('error', (err) => logger.warn({ err: err.message }, 'idle session-pool connection failed'));
  const ctx: AppContext = { config, logger, sequelize, s3: createS3Client(config.s3), mail: createMailTransport(config), pgPool, events: new TeamEvents(logger) };
  registerSubscribers(ctx);
  startMailOutbox(ctx); // retries mail the SMTP server did not take (server/mail/outbox.ts)
  return ctx;
}

export async function closeContext(ctx: AppContext): Promise<void> {
  stopMailOutbox(ctx);
  ctx.mail?.close();
  ctx.s3.destroy();
  await ctx.sequelize.close();
  await ctx.pgPool.end();
}
