/** The team activity table: filters already checked by the shared schema; cursors decoded here. */
import type { ActivityPage, ActivityQuery } from '../../shared/schemas/activity';
import { decodeCursor, encodeCursor } from './activity-cursor';
import { countActivity, pageActivity } from './activity.repository';

export async function listActivity(teamId: string, q: ActivityQuery): Promise<ActivityPage> {
  const before = q.before ? decodeCursor('before', q.before) : undefined;
  const after = q.after ? decodeCursor('after', q.after) : undefined;
  const filter = { teamId, type: q.type, pack: q.pack, actor: q.actor, subject: q.subject };
  const [page, total] = await Promise.all([pageActivity(filter, { limit: q.limit, before, after }), q.count ? countActivity(filter) : Promise.resolve(undefined)]);
  const first = page.rows[0];
  const last = page.rows[page.rows.length - 1];
  const key = (r: { at: string; id: string }) => encodeCursor({ at: new Date(r.at), id: r.id });
  return {
    items: page.rows,
    // an empty page past either end points back at where it started
    older: page.hasOlder ? (last ? key(last) : (q.after ?? null)) : null,
    newer: page.hasNewer ? (first ? key(first) : (q.before ?? null)) : null,
    ...(total === undefined ? {} : { total }),
  };
}
