import { Router } from 'express';
import type { AppContext } from '../context';
import { requireTeam, requireUser } from '../auth/require-role';
import { principalOf, teamAccessOf } from '../auth/principal';
import { validateBody } from '../http/validate';
import { profileReplaceSchema, type StoredProfileDto } from '../../shared/schemas/profiles';
import * as profiles from './profiles.service';

/** Target profiles of a team: every member (and the team's service tokens) reads; engineers and admins edit. */
export function profileRoutes(ctx: AppContext): Router {
  const router = Router();
  // a team event after the change commits (server/events/team-events.ts); actor = the signed-in person
  const publish = (res: Parameters<typeof teamAccessOf>[0], type: 'profile.created' | 'profile.updated' | 'profile.deleted', saved: StoredProfileDto, data: Record<string, unknown> = {}) => {
    const p = principalOf(res);
    return ctx.events.publish({ type, teamId: teamAccessOf(res).teamId, actorId: p.kind === 'user' ? p.user.id : null, subject: { kind: 'profile', id: saved.id, label: saved.profile.name }, data });
  };

  // GET /api/teams/:teamId/profiles → { profiles: StoredProfileDto[] } in the team's order
  router.get('/teams/:teamId/profiles', requireTeam('team.read'), async (_req, res) => {
    res.json({ profiles: await profiles.listProfiles(teamAccessOf(res).teamId) });
  });

  // POST /api/teams/:teamId/profiles <Profile> → 201 { profile: StoredProfileDto }; 409 name_taken
  router.post('/teams/:teamId/profiles', requireUser(), requireTeam('profiles.edit'), async (req, res) => {
    const profile = await profiles.createProfile(teamAccessOf(res).teamId, req.body);
    await publish(res, 'profile.created', profile, { version: profile.version });
    res.status(201).json({ profile });
  });

  // PUT /api/teams/:teamId/profiles/:profileId { profile, version } → 200; 409 version_conflict | name_taken
  router.put('/teams/:teamId/profiles/:profileId', requireUser(), requireTeam('profiles.edit'), validateBody(profileReplaceSchema), async (req, res) => {
    const saved = await profiles.replaceProfile(teamAccessOf(res).teamId, String(req.params.profileId), req.body.profile, req.body.version);
    await publish(res, 'profile.updated', saved, { version: saved.version });
    res.json({ profile: saved });
  });

  // DELETE /api/teams/:teamId/profiles/:profileId → 204
  router.delete('/teams/:teamId/profiles/:profileId', requireUser(), requireTeam('profiles.edit'), async (req, res) => {
    const gone = await profiles.getProfile(teamAccessOf(res).teamId, String(req.params.profileId));
    await profiles.removeProfile(teamAccessOf(res).teamId, String(req.params.profileId));
    await publish(res, 'profile.deleted', gone);
    res.status(204).end();
  });

  return router;
}
