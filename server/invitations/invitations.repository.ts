/** Invitations in PostgreSQL. The only module that touches the Invitation model. */
import { Op, type Transaction } from 'sequelize';
import { Invitation } from '../models';
import type { Role } from '../../shared/schemas/roles';

export interface StoredInvitation {
  id: string;
  teamId: string;
  email: string;
  role: Role;
  invitedBy: string | null;
  expiresAt: string;
  acceptedAt: string | null;
  createdAt: string;
}

const toStored = (r: Invitation): StoredInvitation => ({
  id: r.id,
  teamId: r.teamId as string,
  email: r.email,
  role: r.role,
  invitedBy: r.invitedBy,
  expiresAt: r.expiresAt.toISOString(),
  acceptedAt: r.acceptedAt ? r.acceptedAt.toISOString() : null,
  createdAt: r.createdAt.toISOString(),
});

export async function insertInvitation(i: { id: string; teamId: string; email: string; role: Role; tokenHash: string; invitedBy: string; expiresAt: Date }): Promise<StoredInvitation> {
  return toStored(await Invitation.create(i));
}

/** Invitations still waiting for an answer. */
export async function listPending(teamId: string, now: Date): Promise<StoredInvitation[]> {
  const rows = await Invitation.findAll({ where: { teamId, acceptedAt: null, expiresAt: { [Op.gt]: now } }, order: [['createdAt', 'DESC']] });
  return rows.map(toStored);
}

export async function findWithHash(id: string): Promise<{ invitation: StoredInvitation; tokenHash: string } | null> {
  const r = await Invitation.findByPk(id);
  return r ? { invitation: toStored(r), tokenHash: r.tokenHash } : null;
}

/** Marks it accepted if still open; false when it was accepted (or withdrawn) meanwhile. */
export async function consume(id: string, now: Date, transaction: Transaction): Promise<boolean> {
  const [n] = await Invitation.update({ acceptedAt: now }, { where: { id, acceptedAt: null, expiresAt: { [Op.gt]: now } }, transaction });
  return n > 0;
}

export async function withdraw(teamId: string, id: string): Promise<boolean> {
  return (await Invitation.destroy({ where: { teamId, id, acceptedAt: null } })) > 0;
}
