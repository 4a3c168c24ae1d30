/** notifications rows: one person's notices, newest first, paged by (created_at, id). */
import { Op, QueryTypes } from 'sequelize';
import { Membership, Notification, PackVersion, User } from '../models';
import { NOTICE_PAGE, type NoticeDto } from '../../shared/schemas/notifications';
import type { Role } from '../../shared/schemas/roles';

export interface NewNotice {
  userId: string;
  type: string;
  teamId: string;
  packId: string | null;
  versionId: string | null;
  text: string;
  link: string;
}

export async function insertNotices(rows: NewNotice[]): Promise<void> {
  if (rows.length) await Notification.bulkCreate(rows);
}

export async function nameOf(userId: string | null): Promise<string | null> {
  return userId ? ((await User.findByPk(userId, { attributes: ['name'] }))?.name ?? null) : null;
}

export async function proposerOf(versionId: string): Promise<string | null> {
  return (await PackVersion.findByPk(versionId, { attributes: ['proposedBy'] }))?.proposedBy ?? null;
}

export async function membersWithRoles(teamId: string, roles: readonly Role[]): Promise<string[]> {
  return (await Membership.findAll({ where: { teamId, role: { [Op.in]: [...roles] } }, attributes: ['userId'] })).map((m) => m.userId as string);
}

interface Row {
  id: string;
  type: string;
  team_id: string;
  team_name: string;
  pack_slug: string | null;
  number: number | null;
  text: string;
  link: string;
  read_at: Date | null;
  created_at: Date;
}

export async function listNotices(userId: string, before?: { at: Date; id: string }): Promise<{ notices: NoticeDto[]; hasOlder: boolean }> {
  const rows = await Notification.sequelize!.query<Row>(
    `SELECT n.id, n.type, n.team_id, t.name AS team_name, p.slug AS pack_slug, v.number, n.text, n.link, n.read_at, n.created_at
       FROM notifications n
       JOIN teams t ON t.id = n.team_id
       LEFT JOIN packs p ON p.id = n.pack_id
       LEFT JOIN pack_versions v ON v.id = n.version_id
      WHERE n.user_id = :userId ${before ? 'AND (n.created_at, n.id) < (:at, :id)' : ''}
      ORDER BY n.created_at DESC, n.id DESC
      LIMIT :limit`,
    { replacements: { userId, at: before?.at ?? null, id: before?.id ?? null, limit: NOTICE_PAGE + 1 }, type: QueryTypes.SELECT },
  );
  return {
    hasOlder: rows.length > NOTICE_PAGE,
    notices: rows.slice(0, NOTICE_PAGE).map((r) => ({
      id: r.id, type: r.type, team: { id: r.team_id, name: r.team_name }, pack: r.pack_slug ? { slug: r.pack_slug } : null,
      version: r.number, text: r.text, link: r.link, readAt: r.read_at ? new Date(r.read_at).toISOString() : null, createdAt: new Date(r.created_at).toISOString(),
    })),
  };
}

export async function countUnread(userId: string): Promise<number> {
  return Notification.count({ where: { userId, readAt: null } });
}

/** Marks the person's own notices read (ids of anyone else's match nothing); returns how many changed. */
export async function markRead(userId: string, ids: string[] | 'all'): Promise<number> {
  const where = ids === 'all' ? { userId, readAt: null } : { userId, readAt: null, id: { [Op.in]: ids } };
  const [n] = await Notification.update({ readAt: new Date() }, { where });
  return n;
}
