/**
 * Who is asking, resolved once per request by server/auth/authenticate.ts and kept on res.locals.
 * Routes read it with principalOf(res); the guards in ./require-role.ts decide what it may do.
 */
import type { Response } from 'express';
import type { Role } from '../../shared/schemas/roles';

export interface SessionUser {
  id: string;
  email: string;
  name: string;
  studioId: string;
}

export type Principal =
  | { kind: 'anonymous' }
  | { kind: 'user'; user: SessionUser; sessionId: string }
  | { kind: 'token'; token: { id: string; teamId: string; name: string; packSlugs: string[] | null } }
  /** A bearer token was presented but is malformed, unknown or revoked: every guarded route answers 401. */
  | { kind: 'bad-token'; message: string };

export function principalOf(res: Response): Principal {
  return (res.locals.principal as Principal | undefined) ?? { kind: 'anonymous' };
}

/** The team a guarded team route acts on, set by requireTeam(). */
export interface TeamAccess {
  teamId: string;
  /** The member's role; null for a service token. */
  role: Role | null;
}

export function teamAccessOf(res: Response): TeamAccess {
  const t = res.locals.teamAccess as TeamAccess | undefined;
  if (!t) throw new Error('teamAccessOf() used on a route without requireTeam()');
  return t;
}

/** For pack routes (later issues): may this token read the pack? A session user is checked by role instead. */
export function tokenAllowsPack(p: Principal, packSlug: string): boolean {
  return p.kind !== 'token' || p.token.packSlugs === null || p.token.packSlugs.includes(packSlug);
}
