/**
 * The one place roles are checked on the server. Every API route uses one of these guards (or is
 * listed as public in tests/api/authorization-matrix.test.ts):
 *   requireUser()          a signed-in person (service tokens → 403, anonymous → 401)
 *   requireTeam(perm)      route has :teamId; the caller is a member whose role has `perm`
 *                          (shared/schemas/roles.ts), or a service token of that team when `perm` is one
 *                          a token holds and the request only reads (GET/HEAD).
 *   requireRoleAnywhere(perm)  a person whose role in at least one team has `perm` (the outbox).
 * Answers: anonymous or bad token 401; token on a write or on a person-only route 403;
 * not a member of the team (or no such team) 404, so team ids cannot be probed; member without the
 * permission 403.
 */
import type { RequestHandler } from 'express';
import { PERMISSIONS, TOKEN_PERMISSIONS, roleCan, type Permission } from '../../shared/schemas/roles';
import { HttpError, forbidden, notFound, unauthorized } from '../http/errors';
import { hasRoleAnywhere, roleOf } from '../teams/teams.repository';
import { principalOf, type TeamAccess } from './principal';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const READS = new Set(['GET', 'HEAD']);

const tokenRefused = () => new HttpError(403, 'token_read_only', 'Service tokens are read-only and cannot use this route.');

export function requireUser(): RequestHandler {
  return (_req, res, next) => {
    const p = principalOf(res);
    if (p.kind === 'anonymous') throw unauthorized();
    if (p.kind === 'bad-token') throw unauthorized(p.message);
    if (p.kind === 'token') throw tokenRefused();
    next();
  };
}

export function requireTeam(permission: Permission): RequestHandler {
  return async (req, res, next) => {
    const p = principalOf(res);
    if (p.kind === 'anonymous') throw unauthorized();
    if (p.kind === 'bad-token') throw unauthorized(p.message);
    const teamId = String(req.params.teamId ?? '');
    const noTeam = () => notFound('No team with that id among yours.');
    if (!UUID.test(teamId)) throw noTeam();
    if (p.kind === 'token') {
      if (p.token.teamId !== teamId) throw noTeam();
      if (!TOKEN_PERMISSIONS.includes(permission) || !READS.has(req.method)) throw tokenRefused();
      res.locals.teamAccess = { teamId, role: null } satisfies TeamAccess;
      return next();
    }
    const role = await roleOf(teamId, p.user.id);
    if (!role) throw noTeam();
    if (!roleCan(role, permission)) {
      throw forbidden(`Your role in this team (${role}) cannot do this; it needs ${PERMISSIONS[permission].join(' or ')}.`);
    }
    res.locals.teamAccess = { teamId, role } satisfies TeamAccess;
    next();
  };
}

export function requireRoleAnywhere(permission: Permission): RequestHandler {
  return async (_req, res, next) => {
    const p = principalOf(res);
    if (p.kind === 'anonymous') throw unauthorized();
    if (p.kind === 'bad-token') throw unauthorized(p.message);
    if (p.kind === 'token') throw tokenRefused();
    if (!(await hasRoleAnywhere(p.user.id, PERMISSIONS[permission]))) {
      throw forbidden(`This needs the ${PERMISSIONS[permission].join(' or ')} role in at least one team.`);
    }
    next();
  };
}
