/**
 * Conditional GET (RFC 9110). If-None-Match (§13.1.2) matches when it is "*" or lists an entity tag
 * equal to ours by the weak comparison (§8.8.3.2: opaque tags equal, W/ prefixes ignored); then a GET
 * answers 304 Not Modified (§15.4.5) with the ETag and Cache-Control it would have sent with a 200.
 */
import { createHash } from 'node:crypto';
import type { Request } from 'express';

export function ifNoneMatchMatches(req: Request, etag: string): boolean {
  const header = req.get('if-none-match');
  if (!header) return false;
  if (header.trim() === '*') return true;
  const ours = etag.replace(/^W\//, '');
  // entity-tag = [ W/ ] DQUOTE *etagc DQUOTE; etagc excludes DQUOTE, so splitting on commas outside quotes is a regex match
  const tags = header.match(/(?:W\/)?"[^"]*"/g) ?? [];
  return tags.some((t) => t.replace(/^W\//, '') === ours);
}

/** A strong ETag for a JSON body: the first 32 hex digits of the SHA-256 of its bytes. */
export function jsonEtag(body: string): string {
  return `"${createHash('sha256').update(body).digest('hex').slice(0, 32)}"`;
}
