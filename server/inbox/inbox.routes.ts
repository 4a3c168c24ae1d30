import { Router } from 'express';
import type { AppContext } from '../context';
import { requireUser } from '../auth/require-role';
import { principalOf } from '../auth/principal';
import type { InboxDto } from '../../shared/schemas/inbox';
import { myProposals, recentReleases, reviewsToDo } from './inbox.repository';

/** The signed-in person's inbox for the home page: reviews to do, their proposals, recent releases in their teams. */
export function inboxRoutes(_ctx: AppContext): Router {
  const router = Router();

  // GET /api/me/inbox → { reviewsToDo, myProposals, recentReleases, more }, each newest first (20 at most;
  // more.<list> says older ones exist)
  router.get('/me/inbox', requireUser(), async (_req, res) => {
    const p = principalOf(res);
    if (p.kind !== 'user') throw new Error('unreachable: requireUser lets only people through');
    const [a, b, c] = await Promise.all([reviewsToDo(p.user.id), myProposals(p.user.id), recentReleases(p.user.id)]);
    const body: InboxDto = {
      reviewsToDo: a.items, myProposals: b.items, recentReleases: c.items,
      more: { reviewsToDo: a.more, myProposals: b.more, recentReleases: c.more },
    };
    res.json(body);
  });

  return router;
}
