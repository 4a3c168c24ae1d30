import { Router } from 'express';
import type { AppContext } from '../context';
import { requireTeam, requireUser } from '../auth/require-role';
import { teamAccessOf } from '../auth/principal';
import { validateBody } from '../http/validate';
import { profileReplaceSchema } from '../../shared/schemas/profiles';
import * as profiles from './profiles.service';

/** Target profiles of a team: every member (and the team's service tokens) reads; engineers and admins edit. */
export function profileRoutes(_ctx: AppContext): Router {
  const router = Router();

  // GET /api/teams/:teamId/profiles → { profiles: StoredProfileDto[] } in the team's order
  router.get('/teams/:teamId/profiles', requireTeam('team.read'), async (_req, res) => {
    res.json({ profiles: await profiles.listProfiles(teamAccessOf(res).teamId) });
  });

  // POST /api/teams/:teamId/profiles <Profile> → 201 { profile: StoredProfileDto }; 409 name_taken
  router.post('/teams/:teamId/profiles', requireUser(), requireTeam('profiles.edit'), async (req, res) => {
    res.status(201).json({ profile: await profiles.createProfile(teamAccessOf(res).teamId, req.body) });
  });

  // PUT /api/teams/:teamId/profiles/:profileId { profile, version } → 200; 409 version_conflict | name_taken
  router.put('/teams/:teamId/profiles/:profileId', requireUser(), requireTeam('profiles.edit'), validateBody(profileReplaceSchema), async (req, res) => {
    const saved = await profiles.replaceProfile(teamAccessOf(res).teamId, String(req.params.profileId), req.body.profile, req.body.version);
    res.json({ profile: saved });
  });

  // DELETE /api/teams/:teamId/profiles/:profileId → 204
  router.delete('/teams/:teamId/profiles/:profileId', requireUser(), requireTeam('profiles.edit'), async (req, res) => {
    await profiles.removeProfile(teamAccessOf(res).teamId, String(req.params.profileId));
    res.status(204).end();
  });

  return router;
}
