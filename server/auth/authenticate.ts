/**
 * Resolves the request's principal once (res.locals.principal, see ./principal.ts):
 *   - `Authorization: Bearer tgt_…` → the service token (or `bad-token` when malformed/unknown/revoked);
 *   - otherwise the lucia session cookie → the user; an expired or unknown cookie is cleared;
 *     a session lucia extended (`fresh`) gets its cookie re-sent, so use keeps a session alive.
 */
import type { RequestHandler } from 'express';
import type { AppContext } from '../context';
import { authenticateToken } from '../tokens/tokens.service';
import { luciaFor } from './lucia';
import type { Principal } from './principal';

export function authenticate(ctx: AppContext): RequestHandler {
  const lucia = luciaFor(ctx);
  return async (req, res, next) => {
    const authorization = req.get('authorization');
    if (authorization !== undefined) {
      const m = /^Bearer\s+(\S+)\s*$/i.exec(authorization);
      let principal: Principal;
      if (!m) principal = { kind: 'bad-token', message: 'The Authorization header must be "Bearer <service token>".' };
      else {
        const check = await authenticateToken(m[1]!);
        principal = check.ok
          ? { kind: 'token', token: { id: check.token.id, teamId: check.token.teamId, name: check.token.name, packSlugs: check.token.packSlugs } }
          : { kind: 'bad-token', message: check.message };
      }
      res.locals.principal = principal;
      return next();
    }
    const sessionId = lucia.readSessionCookie(req.get('cookie') ?? '');
    if (!sessionId) {
      res.locals.principal = { kind: 'anonymous' } satisfies Principal;
      return next();
    }
    const { session, user } = await lucia.validateSession(sessionId);
    if (!session || !user) {
      res.append('Set-Cookie', lucia.createBlankSessionCookie().serialize());
      res.locals.principal = { kind: 'anonymous' } satisfies Principal;
      return next();
    }
    if (session.fresh) res.append('Set-Cookie', lucia.createSessionCookie(session.id).serialize());
    res.locals.principal = {
      kind: 'user',
      user: { id: user.id, email: user.email, name: user.name, studioId: user.studioId },
      sessionId: session.id,
    } satisfies Principal;
    next();
  };
}
