import { Router } from 'express';
import type { AppContext } from '../context';
import { validateBody } from '../http/validate';
import { createTokenSchema } from '../../shared/schemas/accounts';
import { requireTeam } from '../auth/require-role';
import { principalOf, teamAccessOf } from '../auth/principal';
import { uuidParam } from '../invitations/invitations.routes';
import * as tokens from './tokens.service';

export function tokenRoutes(_ctx: AppContext): Router {
  const router = Router();

  // GET /api/teams/:teamId/tokens → admin; names, pack limits, last use (never the secret)
  router.get('/teams/:teamId/tokens', requireTeam('tokens.manage'), async (_req, res) => {
    res.json({ tokens: await tokens.listTokens(teamAccessOf(res).teamId) });
  });

  // POST /api/teams/:teamId/tokens { name, packSlugs? } → admin; 201 { token, secret } — the secret is shown this once
  router.post('/teams/:teamId/tokens', requireTeam('tokens.manage'), validateBody(createTokenSchema), async (req, res) => {
    const p = principalOf(res);
    if (p.kind !== 'user') throw new Error('unreachable: requireTeam lets only people write');
    res.set('Cache-Control', 'no-store');
    res.status(201).json(await tokens.createToken(teamAccessOf(res).teamId, req.body, p.user.id));
  });

  // DELETE /api/teams/:teamId/tokens/:tokenId → admin; 204, the token stops working at once
  router.delete('/teams/:teamId/tokens/:tokenId', requireTeam('tokens.manage'), async (req, res) => {
    await tokens.revokeToken(teamAccessOf(res).teamId, uuidParam(String(req.params.tokenId)));
    res.status(204).end();
  });

  return router;
}
