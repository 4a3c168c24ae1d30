/**
 * Sign-in, sign-out, profile, password change and password reset. Sessions are lucia's (./lucia.ts);
 * passwords Argon2id (./password.ts); reset links are single-use, expire after RESET_MINUTES and are
 * stored as SHA-256 digests (./secret-token.ts).
 */
import { generateIdFromEntropySize } from 'lucia';
import type { AppContext } from '../context';
import { HttpError, badRequest } from '../http/errors';
import { teamsOfUser } from '../teams/teams.repository';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../seed/demo-accounts';
import { ROLE_SUMMARY } from '../../shared/schemas/roles';
import * as repo from './auth.repository';
import { luciaFor } from './lucia';
import { hashPassword, verifyAgainstNothing, verifyPassword } from './password';
import { issueToken, parseToken, secretMatches } from './secret-token';
import { resetMail } from './auth-mail';
import type { SessionUser } from './principal';

export const RESET_MINUTES = 60;

const WRONG_CREDENTIALS = 'That e-mail and password do not match an account.';

export function newUserId(): string {
  return generateIdFromEntropySize(10);
}

export async function signIn(ctx: AppContext, email: string, password: string) {
  const user = await repo.findUserByEmail(email);
  const ok = user ? await verifyPassword(user.passwordHash, password) : await verifyAgainstNothing(password);
  if (!user || !ok) throw new HttpError(401, 'wrong_credentials', WRONG_CREDENTIALS);
  const { cookie } = await startSession(ctx, user.id);
  const signedIn: SessionUser = { id: user.id, email: user.email, name: user.name, studioId: user.studioId };
  return { cookie, user: signedIn };
}

export async function startSession(ctx: AppContext, userId: string): Promise<{ cookie: string }> {
  const lucia = luciaFor(ctx);
  const session = await lucia.createSession(userId, {});
  return { cookie: lucia.createSessionCookie(session.id).serialize() };
}

export async function signOut(ctx: AppContext, sessionId: string): Promise<{ cookie: string }> {
  const lucia = luciaFor(ctx);
  await lucia.invalidateSession(sessionId);
  return { cookie: lucia.createBlankSessionCookie().serialize() };
}

export async function signOutEverywhere(ctx: AppContext, userId: string): Promise<{ cookie: string }> {
  const lucia = luciaFor(ctx);
  await lucia.invalidateUserSessions(userId);
  return { cookie: lucia.createBlankSessionCookie().serialize() };
}

export async function me(user: SessionUser) {
  return {
    user: { id: user.id, email: user.email, name: user.name, studioName: await repo.studioName(user.studioId) },
    teams: await teamsOfUser(user.id),
  };
}

export async function updateProfile(user: SessionUser, name: string) {
  await repo.updateName(user.id, name);
  return me({ ...user, name });
}

/** Changes the password and ends every other session; the caller gets a fresh one. */
export async function changePassword(ctx: AppContext, user: SessionUser, current: string, next: string) {
  const stored = await repo.findUserById(user.id);
  if (!stored || !(await verifyPassword(stored.passwordHash, current))) {
    throw badRequest('The current password is not right.', { currentPassword: 'Current password is not right.' });
  }
  await repo.updatePasswordHash(user.id, await hashPassword(next));
  await luciaFor(ctx).invalidateUserSessions(user.id);
  return startSession(ctx, user.id);
}

/**
 * Sends a reset link when the address has an account. The answer is the same either way, and it
 * comes before the mail is sent, so neither content nor timing tells whether the address exists.
 */
export async function requestReset(ctx: AppContext, email: string): Promise<void> {
  const work = async () => {
    const user = await repo.findUserByEmail(email);
    if (!user) return;
    const issued = issueToken('rst');
    await repo.insertReset({ id: issued.id, userId: user.id, tokenHash: issued.hash, expiresAt: new Date(Date.now() + RESET_MINUTES * 60_000) });
    await resetMail(ctx, { to: user.email, token: issued.token, minutes: RESET_MINUTES });
  };
  void work().catch((err) => ctx.logger.error({ err: (err as Error).message }, 'password reset mail failed'));
}

const badResetLink = () =>
  new HttpError(400, 'invalid_token', 'This reset link is not valid any more: it was used, it expired, or it is incomplete. Ask for a new one.', {
    token: 'The reset link is not valid any more.',
  });

export async function completeReset(ctx: AppContext, token: string, password: string): Promise<void> {
  const parsed = parseToken('rst', token);
  if (!parsed) throw badResetLink();
  const reset = await repo.findReset(parsed.id);
  const matches = secretMatches(parsed.secret, reset?.tokenHash ?? '0'.repeat(64));
  if (!reset || !matches) throw badResetLink();
  const passwordHash = await hashPassword(password);
  await repo.transaction(async (t) => {
    if (!(await repo.consumeReset(parsed.id, new Date(), t))) throw badResetLink();
    await repo.updatePasswordHash(reset.userId, passwordHash, t);
  });
  await luciaFor(ctx).invalidateUserSessions(reset.userId);
}

/** Public: what the sign-in page lists, only in the embedded default. */
export function demoAccounts(ctx: AppContext) {
  if (!ctx.config.demoAccounts) return { enabled: false as const };
  return {
    enabled: true as const,
    password: DEMO_PASSWORD,
    accounts: DEMO_ACCOUNTS.map((a) => ({ email: a.email, name: a.name, role: a.role, summary: ROLE_SUMMARY[a.role], teams: a.teams })),
  };
}

