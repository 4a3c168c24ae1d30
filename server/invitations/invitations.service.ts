/**
 * E-mail invitations: an admin invites an address with a role; the link (valid INVITE_DAYS, single use,
 * stored as a SHA-256 digest) lets a new person set a name and password, or a person who already has an
 * account confirm with their password, and join the team.
 */
import type { AppContext } from '../context';
import { HttpError, conflict, notFound } from '../http/errors';
import { acceptNewAccountSchema } from '../../shared/schemas/accounts';
import type { Role } from '../../shared/schemas/roles';
import { issueToken, parseToken, secretMatches } from '../auth/secret-token';
import { invitationMail } from '../auth/auth-mail';
import { hashPassword, verifyPassword } from '../auth/password';
import * as users from '../auth/auth.repository';
import { newUserId, startSession } from '../auth/auth.service';
import type { SessionUser } from '../auth/principal';
import { addMember, findTeam, roleOf, studioIdOfTeam } from '../teams/teams.repository';
import { zodFields } from '../http/error-middleware';
import * as repo from './invitations.repository';

export const INVITE_DAYS = 7;

export async function invite(ctx: AppContext, teamId: string, inviter: SessionUser, email: string, role: Role) {
  if (!ctx.mail) throw new HttpError(503, 'mail_unavailable', 'No mail server is configured (SMTP_URL), so no invitation can be sent.');
  const team = await findTeam(teamId);
  if (!team) throw notFound('No such team.');
  const existing = await users.findUserByEmail(email);
  if (existing && (await roleOf(teamId, existing.id))) {
    throw new HttpError(409, 'already_member', `${email} is already a member of ${team.name}.`, { email: 'This address is already a member of the team.' });
  }
  const issued = issueToken('inv');
  const expiresAt = new Date(Date.now() + INVITE_DAYS * 86_400_000);
  const invitation = await repo.insertInvitation({ id: issued.id, teamId, email, role, tokenHash: issued.hash, invitedBy: inviter.id, expiresAt });
  try {
    await invitationMail(ctx, { to: email, inviter: inviter.name, teamName: team.name, studioName: team.studioName, role, token: issued.token, expiresAt });
  } catch (err) {
    await repo.withdraw(teamId, invitation.id);
    ctx.logger.error({ err: (err as Error).message }, 'invitation mail failed');
    throw new HttpError(502, 'mail_failed', 'The invitation could not be sent: the mail server did not accept it. Nothing was saved.');
  }
  return invitation;
}

export const listPending = (teamId: string) => repo.listPending(teamId, new Date());

export async function withdraw(teamId: string, id: string): Promise<void> {
  if (!(await repo.withdraw(teamId, id))) throw notFound('No open invitation with that id in this team.');
}

const badLink = () =>
  new HttpError(404, 'invalid_token', 'This invitation link is not valid any more: it was used, withdrawn or expired, or it is incomplete. Ask an admin for a new one.');

async function open(token: string) {
  const parsed = parseToken('inv', token);
  if (!parsed) throw badLink();
  const found = await repo.findWithHash(parsed.id);
  const matches = secretMatches(parsed.secret, found?.tokenHash ?? '0'.repeat(64));
  if (!found || !matches || found.invitation.acceptedAt || Date.parse(found.invitation.expiresAt) <= Date.now()) throw badLink();
  return found.invitation;
}

/** Public: what the accept page shows. */
export async function describe(token: string) {
  const inv = await open(token);
  const team = await findTeam(inv.teamId);
  return {
    email: inv.email,
    role: inv.role,
    teamName: team?.name ?? '',
    studioName: team?.studioName ?? '',
    expiresAt: inv.expiresAt,
    accountExists: (await users.findUserByEmail(inv.email)) !== null,
  };
}

export async function accept(ctx: AppContext, body: { token: string; name?: string; password: string }) {
  const inv = await open(body.token);
  const team = await findTeam(inv.teamId);
  if (!team) throw badLink();
  const existing = await users.findUserByEmail(inv.email);
  let newAccount: { name: string; passwordHash: string } | null = null;
  if (existing) {
    if (!(await verifyPassword(existing.passwordHash, body.password))) {
      throw new HttpError(400, 'wrong_credentials', `${inv.email} already has an account: enter its password to join.`, { password: 'Password is not right for this account.' });
    }
  } else {
    const parsed = acceptNewAccountSchema.safeParse(body);
    if (!parsed.success) {
      const fields = zodFields(parsed.error);
      throw new HttpError(400, 'invalid_request', Object.values(fields)[0] ?? 'Invalid request.', fields);
    }
    newAccount = { name: parsed.data.name, passwordHash: await hashPassword(parsed.data.password) };
  }
  const userId = existing?.id ?? newUserId();
  // one transaction: the link is used up, the account (if new) and the membership exist — or nothing changed
  await users.transaction(async (t) => {
    if (!(await repo.consume(inv.id, new Date(), t))) throw badLink();
    if (newAccount) {
      await users.insertUser({ id: userId, email: inv.email, name: newAccount.name, passwordHash: newAccount.passwordHash, studioId: await studioIdOfTeam(inv.teamId) }, t);
    } else if (await roleOf(inv.teamId, userId)) {
      throw conflict('You are already a member of this team.', 'already_member');
    }
    await addMember(inv.teamId, userId, inv.role, t);
  });
  return startSession(ctx, userId);
}

