/**
 * CSRF protection for cookie-authenticated state-changing requests: the Origin header (or, when a
 * browser sent none, the Referer) must be the app's public origin (config.publicUrl) or the origin the
 * request itself was addressed to. Requests with a bearer token carry no ambient credential and are
 * not checked; a request with neither header and no session cookie carries nothing to abuse either.
 * (OWASP CSRF Prevention Cheat Sheet, "Verifying Origin with standard headers".)
 */
import type { Request, RequestHandler } from 'express';
import type { Config } from '../config';
import { HttpError } from '../http/errors';
import { SESSION_COOKIE } from './lucia';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

function originOf(value: string | undefined): string | null {
  if (!value || value === 'null') return value === 'null' ? 'null' : null;
  try {
    return new URL(value).origin;
  } catch {
    return 'invalid';
  }
}

export function allowedOrigins(config: Pick<Config, 'publicUrl'>, req: Request): Set<string> {
  const set = new Set<string>([new URL(config.publicUrl).origin]);
  const host = req.get('host');
  if (host) set.add(`${req.protocol}://${host}`);
  return set;
}

export function originCheck(config: Pick<Config, 'publicUrl'>): RequestHandler {
  return (req, _res, next) => {
    if (SAFE.has(req.method)) return next();
    if (/^Bearer\s/i.test(req.get('authorization') ?? '')) return next();
    const origin = originOf(req.get('origin')) ?? originOf(req.get('referer'));
    if (origin === null) {
      const hasSession = (req.get('cookie') ?? '').includes(`${SESSION_COOKIE}=`);
      if (!hasSession) return next();
      throw new HttpError(403, 'origin_required', 'This request carries a session cookie but no Origin or Referer header, so it was refused.');
    }
    if (!allowedOrigins(config, req).has(origin)) {
      throw new HttpError(403, 'cross_origin', `Requests from ${origin} may not change anything here.`);
    }
    next();
  };
}
