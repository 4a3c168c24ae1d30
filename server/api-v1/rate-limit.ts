/**
 * Rate limit for /api/v1 (express-rate-limit; counts shared by all instances in PostgreSQL through
 * server/http/pg-rate-limit-store.ts, memory per process only without a database URL):
 * config.apiV1.rateLimit.max requests per window per service token, else per signed-in person, else
 * per client address. Headers: RateLimit-Policy and RateLimit (IETF httpapi-ratelimit-headers draft 8,
 * express-rate-limit's `draft-8`) on every answer, Retry-After (RFC 9110 §10.2.3, seconds) on a 429,
 * whose body is a problem detail with code rate_limited.
 */
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { Config } from '../config';
import { principalOf } from '../auth/principal';
import { problem, sendProblem } from './problem';
import { PgRateLimitStore } from '../http/pg-rate-limit-store';

export function apiV1RateLimiter(config: Pick<Config, 'apiV1' | 'publicUrl'> & Partial<Pick<Config, 'databaseUrl'>>) {
  const { max, windowMs } = config.apiV1.rateLimit;
  return rateLimit({
    // the policy is part of the key (as in server/auth/rate-limit.ts): differently configured instances never mix windows
    store: config.databaseUrl ? new PgRateLimitStore({ databaseUrl: config.databaseUrl, prefix: `api-v1:${max}/${windowMs}:` }) : undefined,
    windowMs,
    limit: max,
    // the database being down is answered by the route (503 problem details), not as a limiter 500
    passOnStoreError: true,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req, res) => {
      const p = principalOf(res);
      if (p.kind === 'token') return `token:${p.token.id}`;
      if (p.kind === 'user') return `user:${p.user.id}`;
      return `ip:${ipKeyGenerator(req.ip ?? '')}`;
    },
    handler: (req, res) => {
      const seconds = Math.ceil(windowMs / 1000);
      sendProblem(res, problem(config.publicUrl, 429, 'rate_limited', `More than ${max} requests in ${seconds} s from this ${principalOf(res).kind === 'token' ? 'service token' : principalOf(res).kind === 'user' ? 'account' : 'address'}. Wait for the time in Retry-After and try again.`, { instance: req.originalUrl.split('?')[0] }));
    },
  });
}
