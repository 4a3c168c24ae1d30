/** Target profiles in PostgreSQL. The only module that touches the TargetProfile model. */
import type { Transaction } from 'sequelize';
import { TargetProfile } from '../models';
import type { Profile } from '../../shared/bake/profile';
import type { StoredProfileDto } from '../../shared/schemas/profiles';

/** An id from the URL that is not a UUID matches no row (PostgreSQL would refuse it as uuid syntax: a 500). */
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const uuidParam = (v: string) => (UUID.test(v) ? v : '00000000-0000-0000-0000-000000000000');

/** The API shape (shared with the client) is the stored shape. */
export type StoredProfile = StoredProfileDto;

function toStored(row: TargetProfile): StoredProfile {
  return {
    id: row.id,
    teamId: row.teamId as string,
    profile: row.spec,
    position: row.position,
    version: row.version,
    updatedAt: row.updatedAt.toISOString(),
  };
}

export async function listProfiles(teamId: string): Promise<StoredProfile[]> {
  const rows = await TargetProfile.findAll({ where: { teamId }, order: [['position', 'ASC'], ['name', 'ASC']] });
  return rows.map(toStored);
}

export async function findProfile(teamId: string, id: string): Promise<StoredProfile | null> {
  const row = await TargetProfile.findOne({ where: { teamId, id: uuidParam(id) } });
  return row ? toStored(row) : null;
}

export async function findProfileByName(teamId: string, name: string, transaction?: Transaction): Promise<StoredProfile | null> {
  const row = await TargetProfile.findOne({ where: { teamId, name }, transaction });
  return row ? toStored(row) : null;
}

export async function insertProfile(teamId: string, profile: Profile, transaction?: Transaction): Promise<StoredProfile> {
  const position = (await TargetProfile.max<number, TargetProfile>('position', { where: { teamId }, transaction })) ?? -1;
  const row = await TargetProfile.create({ teamId, name: profile.name, spec: profile, position: position + 1 }, { transaction });
  return toStored(row);
}

/**
 * Replace a profile when its version is still `expectedVersion` (optimistic concurrency):
 * returns null when someone else saved in between.
 */
export async function updateProfile(teamId: string, id: string, profile: Profile, expectedVersion: number): Promise<StoredProfile | null> {
  const [count, rows] = await TargetProfile.update(
    { name: profile.name, spec: profile, version: expectedVersion + 1 },
    { where: { teamId, id: uuidParam(id), version: expectedVersion }, returning: true },
  );
  return count === 1 && rows[0] ? toStored(rows[0]) : null;
}

export async function deleteProfile(teamId: string, id: string): Promise<boolean> {
  return (await TargetProfile.destroy({ where: { teamId, id: uuidParam(id) } })) === 1;
}
