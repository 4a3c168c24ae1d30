/**
 * Configuration from environment variables, validated with zod at start-up.
 * A bad value stops start-up with a message naming the variable.
 */
import { z } from 'zod';
import { DEFAULT_RETRY_SCHEDULE_SECONDS, parseRetrySchedule } from './webhooks/backoff';

const port = z.coerce.number().int().min(1, 'must be a port number 1–65535').max(65535, 'must be a port number 1–65535');
const bool = z
  .enum(['true', 'false', '1', '0', 'yes', 'no'], { message: 'must be true or false' })
  .transform((v) => v === 'true' || v === '1' || v === 'yes');

export const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('production'),
  PORT: port.default(3000),
  HOST: z.string().min(1).default('127.0.0.1'),
  PUBLIC_URL: z.url({ message: 'must be an absolute URL such as https://curves.example.test' }).optional(),
  DATABASE_URL: z
    .string({ message: 'is required' })
    .regex(/^postgres(ql)?:\/\//, 'must be a postgres:// URL'),
  DATABASE_POOL_MAX: z.coerce.number().int().min(1).max(200).default(10),
  S3_ENDPOINT: z.url({ message: 'must be an absolute URL such as http://127.0.0.1:4569' }).optional(),
  S3_BUCKET: z
    .string()
    .min(3, 'must be 3–63 characters')
    .max(63, 'must be 3–63 characters')
    .regex(/^[a-z0-9][a-z0-9.-]+[a-z0-9]$/, 'must be lower-case letters, digits, dots and hyphens')
    .default('tangentry-library'),
  S3_REGION: z.string().min(1).default('us-east-1'),
  S3_ACCESS_KEY_ID: z.string().min(1, 'is required when S3_ENDPOINT is set').optional(),
  S3_SECRET_ACCESS_KEY: z.string().min(1, 'is required when S3_ENDPOINT is set').optional(),
  S3_FORCE_PATH_STYLE: bool.default(true),
  SMTP_URL: z.string().regex(/^smtps?:\/\//, 'must be an smtp:// or smtps:// URL').optional(),
  MAIL_FROM: z.string().min(3).default('Tangentry <no-reply@tangentry.test>'),
  /** Folder where the embedded mail catcher keeps messages (shown on the outbox page). */
  MAIL_CATCHER_DIR: z.string().min(1).optional(),
  SESSION_TTL_HOURS: z.coerce.number().min(1, 'must be at least 1 hour').max(24 * 90).default(24 * 14),
  SESSION_SECURE_COOKIE: bool.optional(),
  /** Set by scripts/start.ts (and the test harness) when it started the embedded PostgreSQL: enables the demo accounts. */
  TANGENTRY_EMBEDDED: bool.default(false),
  /** Sign-in and password-reset attempts allowed per client address in AUTH_RATE_WINDOW_MINUTES. */
  AUTH_RATE_LIMIT: z.coerce.number().int().min(1, 'must be at least 1').max(100_000).default(10),
  AUTH_RATE_WINDOW_MINUTES: z.coerce.number().min(1, 'must be at least 1 minute').max(24 * 60).default(15),
  /** Requests per API_V1_RATE_WINDOW_SECONDS to /api/v1 per service token (or per person, or per address). High by default. */
  API_V1_RATE_LIMIT: z.coerce.number().int().min(1, 'must be at least 1').max(100_000_000).default(1_000_000),
  API_V1_RATE_WINDOW_SECONDS: z.coerce.number().int().min(1, 'must be at least 1 second').max(24 * 3600).default(60),
  /** `presigned`: /api/v1 downloads answer 302 to a presigned S3 GET URL instead of streaming the bytes. */
  TANGENTRY_DOWNLOAD_REDIRECT: z.enum(['off', 'presigned'], { message: 'must be off or presigned' }).default('off'),
  /** How long a presigned download URL stays valid. */
  TANGENTRY_DOWNLOAD_REDIRECT_SECONDS: z.coerce.number().int().min(1, 'must be at least 1 second').max(3600, 'at most 3600 seconds').default(60),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  /** Webhooks (server/webhooks): how often the dispatcher looks for due deliveries, the waits between attempts, one attempt's timeout. */
  WEBHOOK_POLL_MS: z.coerce.number().int().min(50, 'must be 50–600000 ms').max(600_000, 'must be 50–600000 ms').default(2000),
  WEBHOOK_RETRY_SCHEDULE: z.string().refine((v) => parseRetrySchedule(v) !== null, 'must be a comma-separated list of 1–20 positive waits in seconds, such as 10,60,300').optional(),
  WEBHOOK_TIMEOUT_MS: z.coerce.number().int().min(100, 'must be 100–60000 ms').max(60_000, 'must be 100–60000 ms').default(10_000),
  /** Allow webhook URLs with http:// and loopback/private addresses (tests, a studio-internal receiver). Off: https:// to public addresses only. */
  WEBHOOK_ALLOW_PRIVATE_TARGETS: bool.default(false),
  /** Background bakes (server/jobs): `inline` runs a bake worker inside the API process, `off` leaves bakes to `npm run worker`. */
  TANGENTRY_WORKER: z.enum(['inline', 'off'], { message: 'must be inline or off' }).default('inline'),
  /** Retries of a failed bake job before the bake is marked failed, the delay before the first (doubling with pg-boss backoff), and how long one attempt may run. */
  TANGENTRY_BAKE_RETRY_LIMIT: z.coerce.number().int().min(0, 'must be 0–20').max(20, 'must be 0–20').default(2),
  TANGENTRY_BAKE_RETRY_DELAY_SECONDS: z.coerce.number().int().min(0, 'must be 0–3600 seconds').max(3600, 'must be 0–3600 seconds').default(10),
  TANGENTRY_BAKE_EXPIRE_SECONDS: z.coerce.number().int().min(1, 'must be 1–86400 seconds').max(86_400, 'must be 1–86400 seconds').default(900),
  /** How often pg-boss looks for new jobs and runs its maintenance (expiring jobs of a killed worker). */
  TANGENTRY_JOBS_POLL_SECONDS: z.coerce.number().min(0.5, 'must be at least 0.5 seconds').max(60, 'must be at most 60 seconds').default(1),
  TANGENTRY_JOBS_MAINTENANCE_SECONDS: z.coerce.number().int().min(1, 'must be at least 1 second').max(3600, 'must be at most 3600 seconds').default(30),
  /** Test-only: the worker waits this long after each target of a bake (to kill it in the middle). */
  TANGENTRY_BAKE_DELAY_MS: z.coerce.number().int().min(0, 'must be 0–60000 ms').max(60_000, 'must be 0–60000 ms').default(0),
});

export type Env = z.infer<typeof envSchema>;

export interface Config {
  env: Env['NODE_ENV'];
  port: number;
  host: string;
  publicUrl: string;
  databaseUrl: string;
  databasePoolMax: number;
  s3: { endpoint?: string; bucket: string; region: string; accessKeyId?: string; secretAccessKey?: string; forcePathStyle: boolean };
  smtpUrl?: string;
  mailFrom: string;
  mailCatcherDir?: string;
  session: { ttlHours: number; secureCookie: boolean };
  /** Demo accounts (<role>@corvid-lantern.test) are seeded and listed on the sign-in page: embedded default only. */
  demoAccounts: boolean;
  authRateLimit: { max: number; windowMs: number };
  /** /api/v1: rate limit per token/person/address, and whether downloads redirect to presigned S3 URLs. */
  apiV1: { rateLimit: { max: number; windowMs: number }; downloadRedirect: 'off' | 'presigned'; presignSeconds: number };
  logLevel: Env['LOG_LEVEL'];
  /** Webhook deliveries (server/webhooks): poll interval, retry waits in seconds, attempt timeout, whether http:// and private addresses are allowed. */
  webhooks: { pollMs: number; retryScheduleSeconds: number[]; timeoutMs: number; allowPrivateTargets: boolean };
  /** Background bakes with pg-boss (server/jobs). */
  jobs: { worker: Env['TANGENTRY_WORKER']; retryLimit: number; retryDelaySeconds: number; expireSeconds: number; pollSeconds: number; maintenanceSeconds: number; bakeDelayMs: number };
}

export class ConfigError extends Error {
  constructor(public readonly problems: { variable: string; message: string }[]) {
    super(`Invalid configuration:\n${problems.map((p) => `  ${p.variable}: ${p.message}`).join('\n')}`);
    this.name = 'ConfigError';
  }
}

/** Parse and check the environment. Throws ConfigError naming each bad variable. */
export function loadConfig(source: NodeJS.ProcessEnv = process.env): Config {
  const raw = Object.fromEntries(Object.entries(source).filter(([, v]) => v !== undefined && v !== ''));
  const parsed = envSchema.safeParse(raw);
  if (!parsed.success) {
    throw new ConfigError(parsed.error.issues.map((i) => ({ variable: String(i.path[0] ?? '?'), message: i.message })));
  }
  const e = parsed.data;
  const problems: { variable: string; message: string }[] = [];
  if (e.S3_ENDPOINT && (!e.S3_ACCESS_KEY_ID || !e.S3_SECRET_ACCESS_KEY)) {
    if (!e.S3_ACCESS_KEY_ID) problems.push({ variable: 'S3_ACCESS_KEY_ID', message: 'is required when S3_ENDPOINT is set' });
    if (!e.S3_SECRET_ACCESS_KEY) problems.push({ variable: 'S3_SECRET_ACCESS_KEY', message: 'is required when S3_ENDPOINT is set' });
  }
  if (problems.length) throw new ConfigError(problems);
  const publicUrl = (e.PUBLIC_URL ?? `http://${e.HOST}:${e.PORT}`).replace(/\/$/, '');
  return {
    env: e.NODE_ENV,
    port: e.PORT,
    host: e.HOST,
    publicUrl,
    databaseUrl: e.DATABASE_URL,
    databasePoolMax: e.DATABASE_POOL_MAX,
    s3: {
      endpoint: e.S3_ENDPOINT,
      bucket: e.S3_BUCKET,
      region: e.S3_REGION,
      accessKeyId: e.S3_ACCESS_KEY_ID,
      secretAccessKey: e.S3_SECRET_ACCESS_KEY,
      forcePathStyle: e.S3_FORCE_PATH_STYLE,
    },
    smtpUrl: e.SMTP_URL,
    mailFrom: e.MAIL_FROM,
    mailCatcherDir: e.MAIL_CATCHER_DIR,
    session: { ttlHours: e.SESSION_TTL_HOURS, secureCookie: e.SESSION_SECURE_COOKIE ?? publicUrl.startsWith('https://') },
    demoAccounts: e.TANGENTRY_EMBEDDED,
    authRateLimit: { max: e.AUTH_RATE_LIMIT, windowMs: e.AUTH_RATE_WINDOW_MINUTES * 60_000 },
    apiV1: {
      rateLimit: { max: e.API_V1_RATE_LIMIT, windowMs: e.API_V1_RATE_WINDOW_SECONDS * 1000 },
      downloadRedirect: e.TANGENTRY_DOWNLOAD_REDIRECT,
      presignSeconds: e.TANGENTRY_DOWNLOAD_REDIRECT_SECONDS,
    },
    logLevel: e.LOG_LEVEL,
    webhooks: {
      pollMs: e.WEBHOOK_POLL_MS,
      retryScheduleSeconds: e.WEBHOOK_RETRY_SCHEDULE ? parseRetrySchedule(e.WEBHOOK_RETRY_SCHEDULE)! : [...DEFAULT_RETRY_SCHEDULE_SECONDS],
      timeoutMs: e.WEBHOOK_TIMEOUT_MS,
      allowPrivateTargets: e.WEBHOOK_ALLOW_PRIVATE_TARGETS,
    },
    jobs: {
      worker: e.TANGENTRY_WORKER,
      retryLimit: e.TANGENTRY_BAKE_RETRY_LIMIT,
      retryDelaySeconds: e.TANGENTRY_BAKE_RETRY_DELAY_SECONDS,
      expireSeconds: e.TANGENTRY_BAKE_EXPIRE_SECONDS,
      pollSeconds: e.TANGENTRY_JOBS_POLL_SECONDS,
      maintenanceSeconds: e.TANGENTRY_JOBS_MAINTENANCE_SECONDS,
      bakeDelayMs: e.TANGENTRY_BAKE_DELAY_MS,
    },
  };
}
