/**
 * Read-only service tokens for build servers: create (the secret is shown once), list, revoke, and
 * authenticate a presented `Authorization: Bearer tgt_…` (constant-time hash comparison, last use recorded).
 */
import { issueToken, parseToken, secretMatches } from '../auth/secret-token';
import { notFound } from '../http/errors';
import * as repo from './tokens.repository';

export type { StoredToken } from './tokens.repository';

export async function createToken(teamId: string, input: { name: string; packSlugs?: string[] }, createdBy: string) {
  const issued = issueToken('tgt');
  const packSlugs = input.packSlugs && input.packSlugs.length ? [...new Set(input.packSlugs)].sort() : null;
  const token = await repo.insertToken({ id: issued.id, teamId, name: input.name, tokenHash: issued.hash, packSlugs, createdBy });
  return { token, secret: issued.token };
}

export const listTokens = repo.listTokens;

export async function revokeToken(teamId: string, id: string): Promise<void> {
  if (!(await repo.revokeToken(teamId, id, new Date()))) throw notFound('No live service token with that id in this team.');
}

export type TokenCheck = { ok: true; token: repo.StoredToken } | { ok: false; message: string };

/**
 * Last use is written at most once a minute per token (a build farm can poll often). The stored value
 * decides across instances; `touchedAt` (this process's last write per token id) keeps a burst of
 * concurrent requests that all read the same old value from writing it once each.
 */
const TOUCH_EVERY_MS = 60_000;
const touchedAt = new Map<string, number>();

export async function authenticateToken(presented: string): Promise<TokenCheck> {
  const parsed = parseToken('tgt', presented);
  if (!parsed) return { ok: false, message: 'The bearer token is not a Tangentry service token.' };
  const found = await repo.findTokenWithHash(parsed.id);
  // compare even when nothing was found, so timing does not reveal which ids exist
  const matches = secretMatches(parsed.secret, found?.tokenHash ?? '0'.repeat(64));
  if (!found || !matches) return { ok: false, message: 'The bearer token is not valid.' };
  if (found.token.revokedAt) return { ok: false, message: 'This service token was revoked.' };
  const now = new Date();
  const last = Math.max(found.token.lastUsedAt ? Date.parse(found.token.lastUsedAt) : 0, touchedAt.get(found.token.id) ?? 0);
  if (now.getTime() - last > TOUCH_EVERY_MS) {
    touchedAt.set(found.token.id, now.getTime());
    await repo.touchToken(found.token.id, now);
    found.token.lastUsedAt = now.toISOString();
  }
  return { ok: true, token: found.token };
}
