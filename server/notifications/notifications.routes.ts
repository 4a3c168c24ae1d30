import { Router } from 'express';
import type { AppContext } from '../context';
import { requireUser } from '../auth/require-role';
import { principalOf } from '../auth/principal';
import { validateBody, validateQuery } from '../http/validate';
import { markReadSchema, noticesQuerySchema, type NoticesDto } from '../../shared/schemas/notifications';
import { decodeNoticeCursor, encodeNoticeCursor } from './notice-cursor';
import { countUnread, listNotices, markRead } from './notifications.repository';

/** The signed-in person's in-app notices; nobody reads or marks anyone else's. */
export function notificationRoutes(_ctx: AppContext): Router {
  const router = Router();
  const me = (res: Parameters<typeof principalOf>[0]) => {
    const p = principalOf(res);
    if (p.kind !== 'user') throw new Error('unreachable: requireUser lets only people through');
    return p.user.id;
  };

  // GET /api/me/notifications[?before=] → { unread, notices (30, newest first), older }
  router.get('/me/notifications', requireUser(), validateQuery(noticesQuerySchema), async (_req, res) => {
    const userId = me(res);
    const q = res.locals.query as { before?: string };
    const [page, unread] = await Promise.all([listNotices(userId, q.before ? decodeNoticeCursor(q.before) : undefined), countUnread(userId)]);
    const last = page.notices[page.notices.length - 1];
    const body: NoticesDto = { unread, notices: page.notices, older: page.hasOlder && last ? encodeNoticeCursor(last) : null };
    res.json(body);
  });

  // POST /api/me/notifications/read { ids } | { all: true } → { marked, unread }
  router.post('/me/notifications/read', requireUser(), validateBody(markReadSchema), async (req, res) => {
    const userId = me(res);
    const marked = await markRead(userId, req.body.all ? 'all' : req.body.ids);
    res.json({ marked, unread: await countUnread(userId) });
  });

  return router;
}
