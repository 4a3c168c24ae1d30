import { Router } from 'express';
import type { AppContext } from '../context';
import { requireTeam, requireUser } from '../auth/require-role';
import { principalOf, teamAccessOf } from '../auth/principal';
import { validateBody } from '../http/validate';
import { commentSchema } from '../../shared/schemas/comments';
import { getPack } from '../packs/packs.service';
import { addComment, listComments } from './comments.service';

/**
 * Comments on a pack version. Every member who is a person may comment (leads review, animators answer);
 * tokens may not. A pinned comment names a curve of that version and optionally a time on it.
 */
export function commentRoutes(ctx: AppContext): Router {
  const router = Router();
  const base = '/teams/:teamId/packs/:pack/versions/:number/comments';
  const storage = { s3: ctx.s3, bucket: ctx.config.s3.bucket };

  // GET …/versions/:number/comments → { comments } oldest first
  router.get(base, requireUser(), requireTeam('team.read'), async (req, res) => {
    res.json({ comments: await listComments(principalOf(res), teamAccessOf(res).teamId, String(req.params.pack), Number(req.params.number)) });
  });

  // POST …/versions/:number/comments { body, curve?, time? } → 201 { comment }; 400 names curve or time
  router.post(base, requireUser(), requireTeam('team.read'), validateBody(commentSchema), async (req, res) => {
    const p = principalOf(res);
    if (p.kind !== 'user') throw new Error('unreachable: requireUser lets only people through');
    const teamId = teamAccessOf(res).teamId;
    const slug = String(req.params.pack);
    const { version, comment } = await addComment(storage, p, teamId, slug, Number(req.params.number), p.user.id, req.body);
    const pack = await getPack(p, teamId, slug);
    await ctx.events.publish({
      type: 'version.commented', teamId, actorId: p.user.id, pack: { id: pack.id, slug: pack.slug, name: pack.name },
      subject: { kind: 'version', id: version.id, label: `v${version.number}` },
      data: { version: version.number, commentId: comment.id, curve: comment.curve, time: comment.time, excerpt: comment.body.slice(0, 140), proposedBy: version.proposedBy?.id ?? null },
    });
    res.status(201).json({ comment });
  });

  return router;
}
