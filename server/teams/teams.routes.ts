import { Router } from 'express';
import type { AppContext } from '../context';
import { validateBody } from '../http/validate';
import { memberRoleSchema } from '../../shared/schemas/accounts';
import { requireTeam, requireUser } from '../auth/require-role';
import { principalOf, teamAccessOf } from '../auth/principal';
import * as teams from './teams.service';

export function teamRoutes(_ctx: AppContext): Router {
  const router = Router();

  // GET /api/teams → the caller's teams with their role in each
  router.get('/teams', requireUser(), async (_req, res) => {
    const p = principalOf(res);
    res.json({ teams: p.kind === 'user' ? await teams.teamsOfUser(p.user.id) : [] });
  });

  // GET /api/teams/:teamId → members and the team's service tokens may read it; { id, name, slug, studioName }
  router.get('/teams/:teamId', requireTeam('team.read'), async (_req, res) => {
    res.json({ team: await teams.getTeam(teamAccessOf(res).teamId) });
  });

  // GET /api/teams/:teamId/members → every member (not service tokens)
  router.get('/teams/:teamId/members', requireUser(), requireTeam('members.read'), async (_req, res) => {
    res.json({ members: await teams.listMembers(teamAccessOf(res).teamId) });
  });

  // PATCH /api/teams/:teamId/members/:userId { role } → admin; 204; 409 last_admin
  router.patch('/teams/:teamId/members/:userId', requireTeam('members.manage'), validateBody(memberRoleSchema), async (req, res) => {
    await teams.changeRole(teamAccessOf(res).teamId, String(req.params.userId), req.body.role);
    res.status(204).end();
  });

  // DELETE /api/teams/:teamId/members/:userId → admin; 204; 409 last_admin
  router.delete('/teams/:teamId/members/:userId', requireTeam('members.manage'), async (req, res) => {
    await teams.removeMember(teamAccessOf(res).teamId, String(req.params.userId));
    res.status(204).end();
  });

  return router;
}
