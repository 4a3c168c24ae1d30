/**
 * A lucia `Adapter` that keeps only the SHA-256 hex digest of each session id in auth_session, the way
 * service tokens and reset links keep only the digest of their secret (server/auth/secret-token.ts).
 * Every session id lucia hands in is hashed before it reaches the PostgreSQL adapter; getSessionAndUser
 * gives lucia back the session under the id the caller presented, so the cookie and lucia's own logic
 * (expiry, extension, delete of an expired session) keep working with the plaintext id while the
 * database never holds it. Reading the table therefore no longer hands out live sessions.
 *
 * A session id is 25 random bytes as 40 lower-case base32 characters (lucia 3.2.2 createSession calls
 * generateIdFromEntropySize(25), node_modules/lucia/dist/core.js), 200 bits, so a plain, unsalted SHA-256
 * is enough: there is nothing to brute-force (common practice, as for the token secrets).
 *
 * getUserSessions can only return the digests as ids; the app never calls lucia.getUserSessions
 * (it only ends all of a person's sessions, which goes by user id).
 */
import type { Adapter, DatabaseSession, DatabaseUser, UserId } from 'lucia';
import { sha256Hex } from './secret-token';

export class HashedSessionAdapter implements Adapter {
  constructor(private readonly inner: Adapter) {}

  async getSessionAndUser(sessionId: string): Promise<[session: DatabaseSession | null, user: DatabaseUser | null]> {
    const [session, user] = await this.inner.getSessionAndUser(sha256Hex(sessionId));
    return [session ? { ...session, id: sessionId } : null, user];
  }

  /** Ids here are the stored digests: the plaintext is not kept anywhere. */
  getUserSessions(userId: UserId): Promise<DatabaseSession[]> {
    return this.inner.getUserSessions(userId);
  }

  setSession(session: DatabaseSession): Promise<void> {
    return this.inner.setSession({ ...session, id: sha256Hex(session.id) });
  }

  updateSessionExpiration(sessionId: string, expiresAt: Date): Promise<void> {
    return this.inner.updateSessionExpiration(sha256Hex(sessionId), expiresAt);
  }

  deleteSession(sessionId: string): Promise<void> {
    return this.inner.deleteSession(sha256Hex(sessionId));
  }

  deleteUserSessions(userId: UserId): Promise<void> {
    return this.inner.deleteUserSessions(userId);
  }

  deleteExpiredSessions(): Promise<void> {
    return this.inner.deleteExpiredSessions();
  }
}
