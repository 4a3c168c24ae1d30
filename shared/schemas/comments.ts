/**
 * Comments on a pack version: on the whole version, or pinned to one curve (by name, as in the version's
 * source) and optionally a time on it. The server checks the curve exists in that version and the time
 * lies inside the curve's domain (first to last key); the shape is checked here.
 */
import { z } from 'zod';

export const commentSchema = z
  .object({
    body: z.string({ error: 'body: write the comment' }).trim().min(1, { error: 'body: write the comment' }).max(5000, { error: 'body: at most 5000 characters' }),
    curve: z.string({ error: 'curve: a curve name' }).trim().min(1, { error: 'curve: a curve name' }).max(200, { error: 'curve: at most 200 characters' }).nullish(),
    time: z.number({ error: 'time: a time in seconds' }).finite({ error: 'time: a finite time in seconds' }).nullish(),
  })
  .superRefine((c, ctx) => {
    if (c.time != null && !c.curve) ctx.addIssue({ code: 'custom', path: ['time'], message: 'time: choose a curve to pin the time to' });
  });
export type CommentInput = z.input<typeof commentSchema>;

export interface CommentDto {
  id: string;
  versionId: string;
  author: { id: string; name: string } | null;
  body: string;
  /** null: about the whole version. */
  curve: string | null;
  /** seconds on that curve; null: the whole curve. */
  time: number | null;
  reviewId: string | null;
  createdAt: string;
}
