import type { Router } from 'express';
import type { AppContext } from '../context';
import { requireTeam, requireUser } from '../auth/require-role';
import { principalOf, teamAccessOf } from '../auth/principal';
import { validateBody } from '../http/validate';
import { proposeVersionSchema } from '../../shared/schemas/versions';
import { jobsOf } from '../jobs/boss';
import * as bakes from './bakes.service';

/**
 * Proposing a version (background bake) and following it. Mounted by ./versions.routes.ts:
 *   POST …/packs/:pack/versions { changelog }  → 202 { bake } once the source is stored and the bake queued
 *   GET  …/packs/:pack/bakes                    → { bakes } queued, baking and failed, newest first
 *   GET  …/packs/:pack/bakes/:bakeId            → { bake } in any state (done: `version` is its number)
 *   POST …/packs/:pack/bakes/:bakeId/retry      → 202 { bake } for a failed one (versions.propose)
 * The team hears `version.proposed` from the worker when the version appears (server/jobs/bake-worker.ts).
 */
export function mountBakeRoutes(router: Router, ctx: AppContext): void {
  const storage = { s3: ctx.s3, bucket: ctx.config.s3.bucket };
  const team = (res: Parameters<typeof teamAccessOf>[0]) => teamAccessOf(res).teamId;
  const base = '/teams/:teamId/packs/:pack';

  router.post(`${base}/versions`, requireUser(), requireTeam('versions.propose'), validateBody(proposeVersionSchema), async (req, res) => {
    const p = principalOf(res);
    if (p.kind !== 'user') throw new Error('unreachable: requireUser lets only people through');
    const bake = await bakes.proposeBake(storage, await jobsOf(ctx), p, team(res), String(req.params.pack), req.body.changelog, p.user.id);
    res.status(202).location(`/api/teams/${team(res)}/packs/${encodeURIComponent(String(req.params.pack))}/bakes/${bake.id}`).json({ bake });
  });

  router.get(`${base}/bakes`, requireTeam('team.read'), async (req, res) => {
    res.json({ bakes: await bakes.listBakes(principalOf(res), team(res), String(req.params.pack)) });
  });

  router.get(`${base}/bakes/:bakeId`, requireTeam('team.read'), async (req, res) => {
    res.json({ bake: await bakes.getBake(principalOf(res), team(res), String(req.params.pack), String(req.params.bakeId)) });
  });

  router.post(`${base}/bakes/:bakeId/retry`, requireUser(), requireTeam('versions.propose'), async (req, res) => {
    const bake = await bakes.retryBake(await jobsOf(ctx), principalOf(res), team(res), String(req.params.pack), String(req.params.bakeId));
    res.status(202).json({ bake });
  });
}
