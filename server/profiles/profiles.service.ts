/**
 * Target profiles per team: list, create, replace, delete. Input is validated at the edge with the
 * shared schema (shared/bake/profile.ts); here the rules that need the database: unique names per team,
 * and no lost update when two engineers edit one profile.
 */
import { UniqueConstraintError } from 'sequelize';
import { parseProfile, type Profile } from '../../shared/bake/profile';
import { HttpError, badRequest, conflict, notFound } from '../http/errors';
import * as repo from './profiles.repository';

export function validProfile(input: unknown): Profile {
  const parsed = parseProfile(input);
  if (!parsed.ok) {
    const fields = Object.fromEntries(parsed.issues.map((i) => [i.path || 'profile', i.message]));
    throw badRequest(parsed.issues[0]?.message ?? 'Invalid target profile.', fields);
  }
  return parsed.profile;
}

const nameTaken = (name: string) =>
  new HttpError(409, 'name_taken', `A target profile named "${name}" already exists in this team.`, {
    name: `name: "${name}" is already used in this team`,
  });

export const listProfiles = repo.listProfiles;

export async function getProfile(teamId: string, id: string): Promise<repo.StoredProfile> {
  const p = await repo.findProfile(teamId, id);
  if (!p) throw notFound('No such target profile in this team.');
  return p;
}

export async function createProfile(teamId: string, input: unknown): Promise<repo.StoredProfile> {
  const profile = validProfile(input);
  try {
    return await repo.insertProfile(teamId, profile);
  } catch (err) {
    if (err instanceof UniqueConstraintError) throw nameTaken(profile.name);
    throw err;
  }
}

export async function replaceProfile(teamId: string, id: string, input: unknown, expectedVersion: number): Promise<repo.StoredProfile> {
  const profile = validProfile(input);
  await getProfile(teamId, id);
  try {
    const saved = await repo.updateProfile(teamId, id, profile, expectedVersion);
    if (!saved) throw conflict('Someone else saved this target profile since you opened it. Reload to see their change.', 'version_conflict');
    return saved;
  } catch (err) {
    if (err instanceof UniqueConstraintError) throw nameTaken(profile.name);
    throw err;
  }
}

export async function removeProfile(teamId: string, id: string): Promise<void> {
  if (!(await repo.deleteProfile(teamId, id))) throw notFound('No such target profile in this team.');
}
