/**
 * The activity table: one row per team event (written by ./activity.subscriber.ts), read newest first
 * with keyset pagination on (at, id): a page after a cursor never repeats or skips a row, however many
 * rows arrive meanwhile (unlike OFFSET).
 */
import { QueryTypes } from 'sequelize';
import { Activity } from '../models';
import type { TeamEvent } from '../events/team-events';
import { activityLinks, describeActivity, type ActivityItem, type ActivityType, type SubjectKind } from '../../shared/schemas/activity';
import type { Keyset } from './activity-cursor';

export async function insertActivity(e: TeamEvent): Promise<void> {
  await Activity.create({
    teamId: e.teamId, actorId: e.actorId, type: e.type,
    packId: e.pack?.id ?? null, packSlug: e.pack?.slug ?? null, packName: e.pack?.name ?? null,
    subjectKind: e.subject.kind, subjectId: e.subject.id ?? null, subjectLabel: e.subject.label,
    data: e.data, at: e.at,
  });
}

export interface ActivityFilter {
  teamId: string;
  type?: ActivityType;
  pack?: string;
  actor?: string;
  subject?: SubjectKind;
}

interface Row {
  id: string;
  type: ActivityType;
  at: Date;
  actor_id: string | null;
  actor_name: string | null;
  pack_id: string | null;
  pack_slug: string | null;
  pack_name: string | null;
  subject_kind: SubjectKind;
  subject_id: string | null;
  subject_label: string;
  data: Record<string, unknown>;
}

function toItem(r: Row): ActivityItem {
  const base = {
    type: r.type,
    pack: r.pack_slug ? { id: r.pack_id, slug: r.pack_slug, name: r.pack_name ?? r.pack_slug } : null,
    subject: { kind: r.subject_kind, id: r.subject_id, label: r.subject_label },
    data: r.data ?? {},
  };
  return {
    id: String(r.id), at: new Date(r.at).toISOString(),
    actor: r.actor_id ? { id: r.actor_id, name: r.actor_name ?? 'someone' } : null,
    ...base, words: describeActivity(base), links: activityLinks(base),
  };
}

function where(f: ActivityFilter): { sql: string; replacements: Record<string, unknown> } {
  const parts = ['a.team_id = :teamId'];
  const replacements: Record<string, unknown> = { teamId: f.teamId };
  if (f.type) { parts.push('a.type = :type'); replacements.type = f.type; }
  // slugs never change, so the slug kept on the row names the pack even after it is renamed
  if (f.pack) { parts.push('a.pack_slug = :pack'); replacements.pack = f.pack; }
  if (f.actor) { parts.push('a.actor_id = :actor'); replacements.actor = f.actor; }
  if (f.subject) { parts.push('a.subject_kind = :subject'); replacements.subject = f.subject; }
  return { sql: parts.join(' AND '), replacements };
}

const SELECT = `SELECT a.id, a.type, a.at, a.actor_id, u.name AS actor_name, a.pack_id, a.pack_slug, a.pack_name,
                       a.subject_kind, a.subject_id, a.subject_label, a.data
                  FROM activity a LEFT JOIN auth_user u ON u.id = a.actor_id`;

/**
 * A page of `limit` rows, newest first. `before`: rows older than that keyset; `after`: rows newer than it
 * (read oldest first, then reversed, so "Newer" returns the page right above). Also says whether rows exist
 * beyond each end of the page.
 */
export async function pageActivity(f: ActivityFilter, opts: { limit: number; before?: Keyset; after?: Keyset }): Promise<{ rows: ActivityItem[]; hasOlder: boolean; hasNewer: boolean }> {
  const w = where(f);
  const q = (sql: string, r: Record<string, unknown>) => Activity.sequelize!.query<Row>(sql, { replacements: { ...w.replacements, ...r }, type: QueryTypes.SELECT });
  let rows: Row[];
  let more: boolean;
  if (opts.after) {
    const got = await q(`${SELECT} WHERE ${w.sql} AND (a.at, a.id) > (:at, :id) ORDER BY a.at ASC, a.id ASC LIMIT :limit`, { at: opts.after.at, id: opts.after.id, limit: opts.limit + 1 });
    more = got.length > opts.limit;
    rows = got.slice(0, opts.limit).reverse();
  } else {
    const cond = opts.before ? ' AND (a.at, a.id) < (:at, :id)' : '';
    const got = await q(`${SELECT} WHERE ${w.sql}${cond} ORDER BY a.at DESC, a.id DESC LIMIT :limit`, { at: opts.before?.at ?? null, id: opts.before?.id ?? null, limit: opts.limit + 1 });
    more = got.length > opts.limit;
    rows = got.slice(0, opts.limit);
  }
  const exists = async (cmp: '<' | '>', k: Row) =>
    (await q(`SELECT 1 AS id FROM activity a WHERE ${w.sql} AND (a.at, a.id) ${cmp} (:at, :id) LIMIT 1`, { at: k.at, id: k.id })).length > 0;
  const first = rows[0];
  const last = rows[rows.length - 1];
  const hasOlder = opts.after ? (last ? await exists('<', last) : false) : more;
  const hasNewer = opts.after ? more : opts.before && first ? await exists('>', first) : Boolean(opts.before);
  return { rows: rows.map(toItem), hasOlder, hasNewer };
}

export async function countActivity(f: ActivityFilter): Promise<number> {
  const w = where(f);
  const [r] = await Activity.sequelize!.query<{ n: string }>(`SELECT count(*) AS n FROM activity a WHERE ${w.sql}`, { replacements: w.replacements, type: QueryTypes.SELECT });
  return Number(r?.n ?? 0);
}
