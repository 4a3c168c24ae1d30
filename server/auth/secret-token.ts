/**
 * Secrets handed out in links and to build servers: `<prefix>_<id>_<secret>`. The id (a UUID without
 * dashes) finds the row; the secret is 32 random bytes, base64url, and only its SHA-256 hex digest is
 * stored. Comparison is constant-time (crypto.timingSafeEqual) so response timing says nothing about
 * how much of a guess was right.
 */
import { createHash, randomBytes, randomUUID, timingSafeEqual } from 'node:crypto';

export type TokenPrefix = 'tgt' | 'inv' | 'rst';

export interface IssuedToken {
  id: string;
  /** What the person (or build server) gets, once. */
  token: string;
  /** What the database keeps. */
  hash: string;
}

export function sha256Hex(value: string): string {
  return createHash('sha256').update(value, 'utf8').digest('hex');
}

export function issueToken(prefix: TokenPrefix): IssuedToken {
  const id = randomUUID();
  const secret = randomBytes(32).toString('base64url');
  return { id, token: `${prefix}_${id.replace(/-/g, '')}_${secret}`, hash: sha256Hex(secret) };
}

/** Splits a presented token; null when it is not of this kind or malformed. */
export function parseToken(prefix: TokenPrefix, presented: string): { id: string; secret: string } | null {
  const m = new RegExp(`^${prefix}_([0-9a-f]{32})_([A-Za-z0-9_-]{43})$`).exec(presented.trim());
  if (!m) return null;
  const h = m[1]!;
  const id = `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
  return { id, secret: m[2]! };
}

/** Constant-time check of a presented secret against the stored SHA-256 hex digest. */
export function secretMatches(secret: string, storedHash: string): boolean {
  const a = Buffer.from(sha256Hex(secret), 'hex');
  const b = Buffer.from(storedHash, 'hex');
  return a.length === b.length && timingSafeEqual(a, b);
}
