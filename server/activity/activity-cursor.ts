/**
 * Page cursors of the activity table: the keyset (at, id) of a row, as base64url("<ISO time>|<id>").
 * Times come from JavaScript Dates (millisecond precision), so the ISO form round-trips exactly.
 */
import { badRequest } from '../http/errors';

export interface Keyset {
  at: Date;
  id: string;
}

export function encodeCursor(k: Keyset): string {
  return Buffer.from(`${k.at.toISOString()}|${k.id}`, 'utf8').toString('base64url');
}

export function decodeCursor(field: string, value: string): Keyset {
  const bad = () => badRequest(`${field}: not a page cursor from this API`, { [field]: `${field}: not a page cursor from this API` });
  const text = Buffer.from(value, 'base64url').toString('utf8');
  const m = /^(\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z)\|(\d{1,19})$/.exec(text);
  if (!m) throw bad();
  const at = new Date(m[1]!);
  if (Number.isNaN(at.getTime())) throw bad();
  return { at, id: m[2]! };
}
