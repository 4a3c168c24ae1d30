/**
 * express-rate-limit on sign-in and password reset: config.authRateLimit.max attempts per client
 * address per window (AUTH_RATE_LIMIT, AUTH_RATE_WINDOW_MINUTES). Memory store per app instance
 * (common practice for one process; several instances would need a shared store).
 */
import { rateLimit } from 'express-rate-limit';
import type { Config } from '../config';

/** `onlyFailures`: count only attempts that failed (sign-in: a right password does not use up the allowance). */
export function authRateLimiter(config: Pick<Config, 'authRateLimit'>, what: string, onlyFailures = false) {
  return rateLimit({
    skipSuccessfulRequests: onlyFailures,
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
