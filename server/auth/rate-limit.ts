/**
 * express-rate-limit on sign-in and password reset: config.authRateLimit.max attempts per client
 * address per window (AUTH_RATE_LIMIT, AUTH_RATE_WINDOW_MINUTES). Counts live in PostgreSQL
 * (server/http/pg-rate-limit-store.ts), so every app instance behind a load balancer shares them;
 * without a database URL (unit tests of the limiter alone) the per-process memory store is used.
 * The key carries the policy (limit/window), so instances configured differently (a rolling change of
 * AUTH_RATE_LIMIT) keep separate counts instead of mixing windows of different lengths.
 */
import { rateLimit } from 'express-rate-limit';
import type { Config } from '../config';
import { PgRateLimitStore } from '../http/pg-rate-limit-store';

/** `onlyFailures`: count only attempts that failed (sign-in: a right password does not use up the allowance). */
export function authRateLimiter(config: Pick<Config, 'authRateLimit'> & Partial<Pick<Config, 'databaseUrl'>>, what: string, onlyFailures = false) {
  return rateLimit({
    store: config.databaseUrl ? new PgRateLimitStore({ databaseUrl: config.databaseUrl, prefix: `auth:${what}:${config.authRateLimit.max}/${config.authRateLimit.windowMs}:` }) : undefined,
    skipSuccessfulRequests: onlyFailures,
    // the database being down is answered by the route itself (503 database_unavailable), not as a limiter 500
    passOnStoreError: true,
    windowMs: config.authRateLimit.windowMs,
    limit: config.authRateLimit.max,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, res, _next, options) => {
      const minutes = Math.ceil(options.windowMs / 60_000);
      res.status(429).json({ error: { code: 'rate_limited', message: `Too many ${what} attempts from this address. Wait ${minutes} minutes and try again.` } });
    },
  });
}
