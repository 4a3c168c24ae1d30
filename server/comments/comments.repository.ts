/** version_comments rows, oldest first, with the author's name. */
import { User, VersionComment } from '../models';
import type { CommentDto } from '../../shared/schemas/comments';

async function toDto(c: VersionComment): Promise<CommentDto> {
  const author = c.authorId ? await User.findByPk(c.authorId, { attributes: ['id', 'name'] }) : null;
  return {
    id: c.id, versionId: c.versionId, author: author ? { id: author.id, name: author.name } : null,
    body: c.body, curve: c.curveName, time: c.time, reviewId: c.reviewId, createdAt: c.createdAt.toISOString(),
  };
}

export async function insertComment(c: { versionId: string; authorId: string; body: string; curveName: string | null; time: number | null; reviewId: string | null }): Promise<CommentDto> {
  return toDto(await VersionComment.create(c));
}

export async function listComments(versionId: string): Promise<CommentDto[]> {
  const rows = await VersionComment.findAll({ where: { versionId }, order: [['createdAt', 'ASC'], ['id', 'ASC']] });
  const names = new Map<string, string>();
  const ids = [...new Set(rows.map((r) => r.authorId).filter((x): x is string => Boolean(x)))];
  if (ids.length) for (const u of await User.findAll({ where: { id: ids }, attributes: ['id', 'name'] })) names.set(u.id, u.name);
  return rows.map((c) => ({
    id: c.id, versionId: c.versionId, author: c.authorId && names.has(c.authorId) ? { id: c.authorId, name: names.get(c.authorId)! } : null,
    body: c.body, curve: c.curveName, time: c.time, reviewId: c.reviewId, createdAt: c.createdAt.toISOString(),
  }));
}
