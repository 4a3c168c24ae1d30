/** Page cursor of the notices list: base64url("<ISO created>|<uuid>"), the keyset (created_at, id). */
import { badRequest } from '../http/errors';

export function encodeNoticeCursor(n: { createdAt: string; id: string }): string {
  return Buffer.from(`${n.createdAt}|${n.id}`, 'utf8').toString('base64url');
}

export function decodeNoticeCursor(value: string): { at: Date; id: string } {
  const m = /^(\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z)\|([0-9a-f-]{36})$/.exec(Buffer.from(value, 'base64url').toString('utf8'));
  if (!m) throw badRequest('before: not a page cursor from this API', { before: 'before: not a page cursor from this API' });
  return { at: new Date(m[1]!), id: m[2]! };
}
