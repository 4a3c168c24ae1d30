/**
 * lucia 3 sessions over @lucia-auth/adapter-postgresql (tables auth_user / auth_session from
 * migration 0002). Cookie: HttpOnly and SameSite=Lax (lucia's fixed defaults), Secure when
 * config.session.secureCookie (https public URL), persistent with the session's expiry.
 * Sessions last config.session.ttlHours and lucia extends them when less than half is left
 * (validateSession marks them `fresh`; server/auth/authenticate.ts then re-sends the cookie).
 * The adapter is wrapped in HashedSessionAdapter: auth_session.id holds the SHA-256 hex digest of the
 * session id, never the id the cookie carries.
 */
import { Lucia, TimeSpan } from 'lucia';
import { NodePostgresAdapter } from '@lucia-auth/adapter-postgresql';
import type { AppContext } from '../context';
import { HashedSessionAdapter } from './hashed-session-adapter';

export const SESSION_COOKIE = 'tangentry_session';

function createLucia(ctx: AppContext) {
  const adapter = new HashedSessionAdapter(new NodePostgresAdapter(ctx.pgPool, { user: 'auth_user', session: 'auth_session' }));
  return new Lucia(adapter, {
    sessionExpiresIn: new TimeSpan(ctx.config.session.ttlHours, 'h'),
    sessionCookie: {
      name: SESSION_COOKIE,
      expires: true,
      attributes: { secure: ctx.config.session.secureCookie, sameSite: 'lax', path: '/' },
    },
    getUserAttributes: (row) => ({ email: row.email, name: row.name, studioId: row.studio_id }),
  });
}

export type AppLucia = ReturnType<typeof createLucia>;

declare module 'lucia' {
  interface Register {
    Lucia: AppLucia;
    DatabaseUserAttributes: { email: string; name: string; studio_id: string };
  }
}

const perContext = new WeakMap<AppContext, AppLucia>();

/** One lucia instance per app context. */
export function luciaFor(ctx: AppContext): AppLucia {
  let l = perContext.get(ctx);
  if (!l) {
    l = createLucia(ctx);
    perContext.set(ctx, l);
  }
  return l;
}
