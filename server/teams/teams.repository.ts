/** Teams and memberships in PostgreSQL. The only module that touches Team, Membership (and reads User for member lists). */
import type { Transaction } from 'sequelize';
import { Membership, Studio, Team, User } from '../models';
import type { Role } from '../../shared/schemas/roles';

export interface TeamSummary {
  id: string;
  name: string;
  slug: string;
  studioName: string;
}

export interface MyTeam extends TeamSummary {
  role: Role;
}

export interface Member {
  userId: string;
  name: string;
  email: string;
  role: Role;
  joinedAt: string;
}

export async function findTeam(id: string): Promise<TeamSummary | null> {
  const t = await Team.findByPk(id, { include: [{ model: Studio, as: 'studio' }] });
  if (!t) return null;
  const studio = (t as Team & { studio?: Studio }).studio;
  return { id: t.id, name: t.name, slug: t.slug, studioName: studio?.name ?? '' };
}

export async function findTeamBySlug(slug: string): Promise<TeamSummary | null> {
  const t = await Team.findOne({ where: { slug } });
  return t ? findTeam(t.id) : null;
}

export async function roleOf(teamId: string, userId: string): Promise<Role | null> {
  const m = await Membership.findOne({ where: { teamId, userId } });
  return m ? m.role : null;
}

export async function teamsOfUser(userId: string): Promise<MyTeam[]> {
  const rows = await Membership.findAll({
    where: { userId },
    include: [{ model: Team, as: 'team', include: [{ model: Studio, as: 'studio' }] }],
  });
  return rows
    .map((m) => {
      const team = m.team!;
      const studio = (team as Team & { studio?: Studio }).studio;
      return { id: team.id, name: team.name, slug: team.slug, studioName: studio?.name ?? '', role: m.role };
    })
    .sort((a, b) => a.name.localeCompare(b.name));
}

/** Whether the user holds the role in any team (the outbox is for admins of any team). */
export async function hasRoleAnywhere(userId: string, roles: readonly Role[]): Promise<boolean> {
  return (await Membership.count({ where: { userId, role: [...roles] } })) > 0;
}

export async function listMembers(teamId: string): Promise<Member[]> {
  const rows = await Membership.findAll({ where: { teamId }, include: [{ model: User, as: 'user' }] });
  return rows
    .map((m) => ({ userId: m.userId as string, name: m.user!.name, email: m.user!.email, role: m.role, joinedAt: m.createdAt.toISOString() }))
    .sort((a, b) => a.name.localeCompare(b.name));
}

export async function countAdmins(teamId: string, transaction?: Transaction): Promise<number> {
  return Membership.count({ where: { teamId, role: 'admin' }, transaction });
}

export async function setRole(teamId: string, userId: string, role: Role, transaction?: Transaction): Promise<boolean> {
  const [n] = await Membership.update({ role }, { where: { teamId, userId }, transaction });
  return n > 0;
}

export async function removeMember(teamId: string, userId: string, transaction?: Transaction): Promise<boolean> {
  return (await Membership.destroy({ where: { teamId, userId }, transaction })) > 0;
}

export async function addMember(teamId: string, userId: string, role: Role, transaction?: Transaction): Promise<void> {
  await Membership.create({ teamId, userId, role }, { transaction });
}

/** Serialises role changes in one team (so two admins cannot demote each other at once). */
export async function lockTeam(teamId: string, transaction: Transaction): Promise<void> {
  await Team.findByPk(teamId, { transaction, lock: transaction.LOCK.UPDATE });
}

export function sequelizeOf() {
  return Membership.sequelize!;
}

export async function studioIdOfTeam(teamId: string): Promise<string> {
  const t = await Team.findByPk(teamId);
  if (!t) throw new Error(`no team ${teamId}`);
  return t.studioId as string;
}
