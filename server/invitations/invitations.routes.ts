import { Router } from 'express';
import type { AppContext } from '../context';
import { validateBody } from '../http/validate';
import { acceptInvitationSchema, inviteSchema } from '../../shared/schemas/accounts';
import { requireTeam } from '../auth/require-role';
import { principalOf, teamAccessOf } from '../auth/principal';
import { authRateLimiter } from '../auth/rate-limit';
import * as invitations from './invitations.service';

export function invitationRoutes(ctx: AppContext): Router {
  const router = Router();
  const acceptLimit = authRateLimiter(ctx.config, 'invitation', true);

  // GET /api/invitations/:token → public; { email, role, teamName, studioName, expiresAt, accountExists }; 404 when used/expired
  router.get('/invitations/:token', async (req, res) => {
    res.set('Cache-Control', 'no-store');
    res.json(await invitations.describe(String(req.params.token)));
  });

  // POST /api/invitations/accept { token, name?, password } → 200 + session cookie; the person joins the team
  router.post('/invitations/accept', acceptLimit, validateBody(acceptInvitationSchema), async (req, res) => {
    const { cookie } = await invitations.accept(ctx, req.body);
    res.append('Set-Cookie', cookie);
    res.status(200).json({ joined: true });
  });

  // GET /api/teams/:teamId/invitations → admin; open invitations
  router.get('/teams/:teamId/invitations', requireTeam('invitations.manage'), async (_req, res) => {
    res.json({ invitations: await invitations.listPending(teamAccessOf(res).teamId) });
  });

  // POST /api/teams/:teamId/invitations { email, role } → admin; 201, the mail is sent
  router.post('/teams/:teamId/invitations', requireTeam('invitations.manage'), validateBody(inviteSchema), async (req, res) => {
    const p = principalOf(res);
    if (p.kind !== 'user') throw new Error('unreachable: requireTeam lets only people write');
    const invitation = await invitations.invite(ctx, teamAccessOf(res).teamId, p.user, req.body.email, req.body.role);
    res.status(201).json({ invitation });
  });

  // DELETE /api/teams/:teamId/invitations/:invitationId → admin; 204, the link stops working
  router.delete('/teams/:teamId/invitations/:invitationId', requireTeam('invitations.manage'), async (req, res) => {
    await invitations.withdraw(teamAccessOf(res).teamId, uuidParam(String(req.params.invitationId)));
    res.status(204).end();
  });

  return router;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
/** A non-UUID id cannot name a row: the all-zero UUID makes the lookup miss and answer 404. */
export function uuidParam(v: string): string {
  return UUID.test(v) ? v : '00000000-0000-0000-0000-000000000000';
}
