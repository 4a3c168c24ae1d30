/** Teams and their members: list, change a role, remove — never leaving a team without an admin. */
import { HttpError, notFound } from '../http/errors';
import type { Role } from '../../shared/schemas/roles';
import * as repo from './teams.repository';

export const teamsOfUser = repo.teamsOfUser;
export const listMembers = repo.listMembers;

export async function getTeam(teamId: string) {
  const t = await repo.findTeam(teamId);
  if (!t) throw notFound('No such team.');
  return t;
}

const lastAdmin = () =>
  new HttpError(409, 'last_admin', 'A team needs at least one admin: make someone else admin first.', { role: 'The last admin cannot lose the admin role.' });

export async function changeRole(teamId: string, userId: string, role: Role): Promise<void> {
  await repo.sequelizeOf().transaction(async (t) => {
    await repo.lockTeam(teamId, t);
    const current = await repo.roleOf(teamId, userId);
    if (!current) throw notFound('That person is not a member of this team.');
    if (current === 'admin' && role !== 'admin' && (await repo.countAdmins(teamId, t)) <= 1) throw lastAdmin();
    await repo.setRole(teamId, userId, role, t);
  });
}

export async function removeMember(teamId: string, userId: string): Promise<void> {
  await repo.sequelizeOf().transaction(async (t) => {
    await repo.lockTeam(teamId, t);
    const current = await repo.roleOf(teamId, userId);
    if (!current) throw notFound('That person is not a member of this team.');
    if (current === 'admin' && (await repo.countAdmins(teamId, t)) <= 1) throw lastAdmin();
    await repo.removeMember(teamId, userId, t);
  });
}
