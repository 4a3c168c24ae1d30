/** Service tokens in PostgreSQL. The only module that touches the ServiceToken model. */
import { ServiceToken } from '../models';

export interface StoredToken {
  id: string;
  teamId: string;
  name: string;
  packSlugs: string[] | null;
  createdBy: string | null;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

function toStored(row: ServiceToken): StoredToken {
  return {
    id: row.id,
    teamId: row.teamId as string,
    name: row.name,
    packSlugs: row.packSlugs,
    createdBy: row.createdBy,
    createdAt: row.createdAt.toISOString(),
    lastUsedAt: row.lastUsedAt ? row.lastUsedAt.toISOString() : null,
    revokedAt: row.revokedAt ? row.revokedAt.toISOString() : null,
  };
}

export async function insertToken(t: { id: string; teamId: string; name: string; tokenHash: string; packSlugs: string[] | null; createdBy: string }): Promise<StoredToken> {
  return toStored(await ServiceToken.create(t));
}

export async function listTokens(teamId: string): Promise<StoredToken[]> {
  const rows = await ServiceToken.findAll({ where: { teamId }, order: [['createdAt', 'DESC']] });
  return rows.map(toStored);
}

/** The row and its stored hash, for authentication. */
export async function findTokenWithHash(id: string): Promise<{ token: StoredToken; tokenHash: string } | null> {
  const row = await ServiceToken.findByPk(id);
  return row ? { token: toStored(row), tokenHash: row.tokenHash } : null;
}

export async function touchToken(id: string, at: Date): Promise<void> {
  await ServiceToken.update({ lastUsedAt: at }, { where: { id } });
}

/** Returns false when there is no such live token in the team. */
export async function revokeToken(teamId: string, id: string, at: Date): Promise<boolean> {
  const [n] = await ServiceToken.update({ revokedAt: at }, { where: { id, teamId, revokedAt: null } });
  return n > 0;
}
