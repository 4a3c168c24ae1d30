/**
 * The home page's inbox: three read-only queries over pack_versions, version_reviews and channel_moves,
 * each limited to the teams the person belongs to, newest first, at most INBOX_LIMIT rows; one row more is
 * read to tell whether older ones exist (`more`), so the page can say the list is cut.
 */
import { QueryTypes } from 'sequelize';
import { PackVersion } from '../models';
import { PERMISSIONS } from '../../shared/schemas/roles';
import type { InboxItem } from '../../shared/schemas/inbox';

export const INBOX_LIMIT = 20;

interface Row {
  team_id: string;
  team_name: string;
  pack_slug: string;
  pack_name: string;
  number: number;
  state: string;
  channel: string | null;
  by_name: string | null;
  at: Date;
}

const toItem = (r: Row): InboxItem => ({
  team: { id: r.team_id, name: r.team_name },
  pack: { slug: r.pack_slug, name: r.pack_name },
  version: r.number,
  state: r.state,
  channel: r.channel,
  by: r.by_name,
  at: new Date(r.at).toISOString(),
  path: `/packs/${encodeURIComponent(r.pack_slug)}/versions/${r.number}`,
});

export interface InboxList {
  items: InboxItem[];
  /** Older rows exist beyond the INBOX_LIMIT newest. */
  more: boolean;
}

async function select(sql: string, replacements: Record<string, unknown>): Promise<InboxList> {
  const rows = await PackVersion.sequelize!.query<Row>(sql, { replacements: { ...replacements, limit: INBOX_LIMIT + 1 }, type: QueryTypes.SELECT });
  return { items: rows.slice(0, INBOX_LIMIT).map(toItem), more: rows.length > INBOX_LIMIT };
}

/** Proposed versions (not yet reviewed) in the teams where the person may review, excluding their own. */
export function reviewsToDo(userId: string): Promise<InboxList> {
  return select(
    `SELECT t.id AS team_id, t.name AS team_name, p.slug AS pack_slug, p.name AS pack_name, v.number, v.state,
            NULL AS channel, u.name AS by_name, v.created_at AS at
       FROM pack_versions v
       JOIN packs p ON p.id = v.pack_id
       JOIN teams t ON t.id = p.team_id
       JOIN memberships m ON m.team_id = t.id AND m.user_id = :userId AND m.role IN (:roles)
       LEFT JOIN auth_user u ON u.id = v.proposed_by
      WHERE v.state = 'proposed' AND v.proposed_by IS DISTINCT FROM :userId
      ORDER BY v.created_at DESC, v.number DESC
      LIMIT :limit`,
    { userId, roles: [...PERMISSIONS['versions.review']] },
  );
}

/** The person's own proposals in their teams with the state the latest review left; `at` is that review's time. */
export function myProposals(userId: string): Promise<InboxList> {
  return select(
    `SELECT t.id AS team_id, t.name AS team_name, p.slug AS pack_slug, p.name AS pack_name, v.number, v.state,
            NULL AS channel, ru.name AS by_name, COALESCE(r.created_at, v.created_at) AS at
       FROM pack_versions v
       JOIN packs p ON p.id = v.pack_id
       JOIN teams t ON t.id = p.team_id
       JOIN memberships m ON m.team_id = t.id AND m.user_id = :userId
       LEFT JOIN LATERAL (SELECT created_at, reviewer_id FROM version_reviews WHERE version_id = v.id ORDER BY created_at DESC LIMIT 1) r ON true
       LEFT JOIN auth_user ru ON ru.id = r.reviewer_id
      WHERE v.proposed_by = :userId
      ORDER BY at DESC, v.number DESC
      LIMIT :limit`,
    { userId },
  );
}

/** Channel moves (releases and roll-backs) in the person's teams. */
export function recentReleases(userId: string): Promise<InboxList> {
  return select(
    `SELECT t.id AS team_id, t.name AS team_name, p.slug AS pack_slug, p.name AS pack_name, v.number, v.state,
            c.name AS channel, u.name AS by_name, cm.created_at AS at
       FROM channel_moves cm
       JOIN channels c ON c.id = cm.channel_id
       JOIN pack_versions v ON v.id = cm.to_version_id
       JOIN packs p ON p.id = c.pack_id
       JOIN teams t ON t.id = p.team_id
       JOIN memberships m ON m.team_id = t.id AND m.user_id = :userId
       LEFT JOIN auth_user u ON u.id = cm.moved_by
      ORDER BY cm.created_at DESC, cm.id DESC
      LIMIT :limit`,
    { userId },
  );
}
