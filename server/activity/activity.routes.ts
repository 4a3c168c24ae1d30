import { Router } from 'express';
import type { AppContext } from '../context';
import { requireTeam, requireUser } from '../auth/require-role';
import { teamAccessOf } from '../auth/principal';
import { validateQuery } from '../http/validate';
import { activityQuerySchema, type ActivityQuery } from '../../shared/schemas/activity';
import { listActivity } from './activity.service';

/** The team's activity table: every member reads it; service tokens do not (it names people, and build servers have no use for it). */
export function activityRoutes(_ctx: AppContext): Router {
  const router = Router();

  // GET /api/teams/:teamId/activity?type=&pack=&actor=&subject=&before=|after=&limit=&count= → ActivityPage, newest first
  router.get('/teams/:teamId/activity', requireUser(), requireTeam('team.read'), validateQuery(activityQuerySchema), async (_req, res) => {
    res.json(await listActivity(teamAccessOf(res).teamId, res.locals.query as ActivityQuery));
  });

  return router;
}
