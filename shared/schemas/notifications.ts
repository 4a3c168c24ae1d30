/**
 * In-app notices: the list the API answers (`GET /api/me/notifications`) and the body that marks them
 * read (`POST /api/me/notifications/read { ids } | { all: true }`).
 */
import { z } from 'zod';

export const NOTICE_PAGE = 30;

export const noticesQuerySchema = z.object({
  before: z.string().regex(/^[A-Za-z0-9_-]{8,200}$/, { error: 'before: not a page cursor from this API' }).optional(),
});

export const markReadSchema = z
  .object({
    ids: z.array(z.uuid({ error: 'ids: notice ids' }), { error: 'ids: a list of notice ids' }).min(1, { error: 'ids: name at least one notice' }).max(200, { error: 'ids: at most 200 at once' }).optional(),
    all: z.literal(true, { error: 'all: must be true' }).optional(),
  })
  .superRefine((b, ctx) => {
    if (!b.ids === !b.all) ctx.addIssue({ code: 'custom', path: ['ids'], message: 'ids: give { ids: [...] } or { all: true }, one of the two' });
  });
export type MarkReadInput = z.input<typeof markReadSchema>;

export interface NoticeDto {
  id: string;
  type: string;
  team: { id: string; name: string };
  pack: { slug: string } | null;
  version: number | null;
  text: string;
  /** Client path (the current team must be `team.id`). */
  link: string;
  readAt: string | null;
  createdAt: string;
}

export interface NoticesDto {
  unread: number;
  notices: NoticeDto[];
  /** Cursor for older notices, null when there are none. */
  older: string | null;
}
