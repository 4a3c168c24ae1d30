import { Router } from 'express';
import { pipeline } from 'node:stream/promises';
import type { AppContext } from '../context';
import { requireTeam, requireUser } from '../auth/require-role';
import { principalOf, teamAccessOf } from '../auth/principal';
import { uuidParam } from '../invitations/invitations.routes';
import { validateBody, validateQuery } from '../http/validate';
import { compareQuerySchema, reviewSchema } from '../../shared/schemas/versions';
import * as versions from './versions.service';
import { notifyProposer } from './review-mail';
import { getPack } from '../packs/packs.service';
import { ifNoneMatchMatches } from '../http/conditional';
import { mountBakeRoutes } from './bakes.routes';

/**
 * Pack versions: every member and the team's tokens (limited to their packs) read the manifests and
 * download artifacts; admins, leads and animators (versions.propose) propose. The bake runs in the
 * background (./bakes.routes.ts, server/jobs).
 */
export function versionRoutes(ctx: AppContext): Router {
  const router = Router();
  const base = '/teams/:teamId/packs/:pack/versions';
  const storage = { s3: ctx.s3, bucket: ctx.config.s3.bucket };
  const team = (res: Parameters<typeof teamAccessOf>[0]) => teamAccessOf(res).teamId;

  // GET …/versions → { versions } newest first
  router.get(base, requireTeam('team.read'), async (req, res) => {
    res.json({ versions: await versions.listVersions(principalOf(res), team(res), String(req.params.pack)) });
  });

  // POST …/versions { changelog } → 202 { bake }; the bake routes (GET …/bakes[/:id], retry) are in ./bakes.routes.ts
  mountBakeRoutes(router, ctx);

  // GET …/versions/:number → { version } with its artifacts (size, SHA-256)
  router.get(`${base}/:number`, requireTeam('team.read'), async (req, res) => {
    res.json({ version: await versions.getVersion(principalOf(res), team(res), String(req.params.pack), Number(req.params.number)) });
  });

  // GET …/versions/:number/artifacts/:artifactId → the bytes, streamed from the bucket. The ETag is the
  // SHA-256, so a build server sending If-None-Match with the checksum it has gets 304 and no bytes.
  router.get(`${base}/:number/artifacts/:artifactId`, requireTeam('artifacts.download'), async (req, res) => {
    const a = await versions.findArtifact(storage, principalOf(res), team(res), String(req.params.pack), Number(req.params.number), uuidParam(String(req.params.artifactId)));
    const etag = `"${a.artifact.sha256}"`;
    res.set({ ETag: etag, 'X-Content-SHA256': a.artifact.sha256, 'Cache-Control': 'private, max-age=31536000, immutable' });
    if (ifNoneMatchMatches(req, etag)) {
      res.status(304).end();
      return;
    }
    const body = await a.open();
    res.set({
      'Content-Type': a.artifact.mediaType,
      'Content-Length': String(a.artifact.size),
      'Content-Disposition': `attachment; filename="${a.downloadName.replace(/[^\w.-]/g, '_')}"`,
    });
    await pipeline(body, res);
  });

  // GET …/versions/:number/compare?against=<n> → { comparison } with the one before it by default
  router.get(`${base}/:number/compare`, requireTeam('team.read'), validateQuery(compareQuerySchema), async (req, res) => {
    const q = res.locals.query as { against?: number };
    res.json({ comparison: await versions.compare(storage, principalOf(res), team(res), String(req.params.pack), Number(req.params.number), q.against) });
  });

  // POST …/versions/:number/reviews { decision: approve | request-changes, comment } → 201 { version } (leads,
  // admins); the proposer gets an e-mail
  router.post(`${base}/:number/reviews`, requireUser(), requireTeam('versions.review'), validateBody(reviewSchema), async (req, res) => {
    const p = principalOf(res);
    if (p.kind !== 'user') throw new Error('unreachable: requireUser lets only people through');
    const slug = String(req.params.pack);
    const version = await versions.review(p, team(res), slug, Number(req.params.number), p.user.id, req.body);
    await notifyProposer(ctx, slug, version, p.user.id);
    const pack = await getPack(p, team(res), slug);
    const latest = version.reviews[version.reviews.length - 1];
    await ctx.events.publish({
      type: req.body.decision === 'approve' ? 'version.approved' : 'version.changes-requested', teamId: team(res), actorId: p.user.id,
      pack: { id: pack.id, slug: pack.slug, name: pack.name }, subject: { kind: 'version', id: version.id, label: `v${version.number}` },
      data: { version: version.number, reviewId: latest?.id ?? null, comment: req.body.comment, proposedBy: version.proposedBy?.id ?? null },
    });
    res.status(201).json({ version });
  });

  return router;
}
