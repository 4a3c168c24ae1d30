/**
 * The build-server API, /api/v1 (docs/api.md). Service tokens (`Authorization: Bearer tgt_…`, read-only,
 * limited to their packs: other packs answer 404) and signed-in people use the same routes. Everything
 * under /api/v1 is rate limited (./rate-limit.ts) and every error is an RFC 9457 problem detail
 * (./problem.ts). Caching (RFC 9110, RFC 9111):
 *   - manifests and channel reads: `Cache-Control: no-cache` and a strong ETag of the body, so a client
 *     revalidates every time and gets 304 when nothing changed;
 *   - artifacts and sources: immutable bytes, ETag `"<sha256>"`, `private, max-age=31536000, immutable`;
 *     a matching If-None-Match answers 304 from the version's artifact rows alone (kept in memory once
 *     read: ./api-v1.reads.ts), without reading the bucket.
 * The route list is mirrored in ./openapi.ts; tests/api/api-v1-openapi.test.ts checks both agree.
 */
import { Router, type Request, type RequestHandler, type Response } from 'express';
import { pipeline } from 'node:stream/promises';
import { GetObjectCommand } from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import type { AppContext } from '../context';
import { requireTeam } from '../auth/require-role';
import { principalOf } from '../auth/principal';
import { HttpError, unauthorized } from '../http/errors';
import { openObject } from '../storage/content-store';
import { artifactPathSchema, channelPathSchema, packPathSchema, versionPathSchema } from '../../shared/schemas/api-v1';
import * as v1 from './api-v1.service';
import { ImmutableVersions } from './api-v1.reads';
import { ifNoneMatchMatches, jsonEtag } from '../http/conditional';
import { problemErrorHandler, problemNotFound } from './problem';
import { apiV1RateLimiter } from './rate-limit';
import { openApiDocument } from './openapi';

export const IMMUTABLE = 'private, max-age=31536000, immutable';

/** A token or a signed-in person (whoami): anonymous and bad tokens get 401. */
const requireCaller = (): RequestHandler => (_req, res, next) => {
  const p = principalOf(res);
  if (p.kind === 'anonymous') throw unauthorized('Send a service token (Authorization: Bearer tgt_…) or sign in.');
  if (p.kind === 'bad-token') throw unauthorized(p.message);
  next();
};

/** JSON that changes (manifests of a channel, a version's review state): revalidate every time. */
function sendRevalidated(req: Request, res: Response, value: unknown): void {
  const body = JSON.stringify(value);
  const etag = jsonEtag(body);
  res.set({ ETag: etag, 'Cache-Control': 'no-cache', Vary: 'Authorization, Cookie' });
  if (ifNoneMatchMatches(req, etag)) {
    res.status(304).end();
    return;
  }
  res.type('application/json').send(body);
}

export function apiV1Routes(ctx: AppContext): Router {
  const router = Router();
  const storage = { s3: ctx.s3, bucket: ctx.config.s3.bucket };
  const { publicUrl, apiV1 } = ctx.config;
  const team = '/v1/teams/:teamId';
  const version = `${team}/packs/:pack/versions/:number`;
  // the parts of versions that never change, per app instance (channels and review states are always read)
  const versions = new ImmutableVersions();

  router.use('/v1', apiV1RateLimiter(ctx.config));

  /** Immutable bytes: 304 on a matching If-None-Match; else the bytes, or 302 to a presigned S3 URL. */
  async function sendDownload(req: Request, res: Response, d: v1.Download): Promise<void> {
    const etag = `"${d.sha256}"`;
    res.set({ ETag: etag, 'X-Content-SHA256': d.sha256, 'Cache-Control': IMMUTABLE });
    if (ifNoneMatchMatches(req, etag)) {
      res.status(304).end();
      return;
    }
    const disposition = `attachment; filename="${d.downloadName.replace(/[^\w.-]/g, '_')}"`;
    if (apiV1.downloadRedirect === 'presigned') {
      const url = await getSignedUrl(ctx.s3, new GetObjectCommand({ Bucket: storage.bucket, Key: d.key, ResponseContentType: d.mediaType, ResponseContentDisposition: disposition }), { expiresIn: apiV1.presignSeconds });
      // the redirect itself expires with the URL: not stored
      res.set('Cache-Control', 'no-store').redirect(302, url);
      return;
    }
    let body;
    try {
      body = (await openObject(ctx.s3, storage.bucket, d.key)).body;
    } catch (err) {
      throw new HttpError(503, 'storage_unavailable', `Could not read ${d.downloadName} from storage (${(err as Error).message}). Try again.`);
    }
    res.set({ 'Content-Type': d.mediaType, 'Content-Length': String(d.size), 'Content-Disposition': disposition });
    await pipeline(body, res);
  }

  // GET /api/v1/openapi.json → the OpenAPI 3.1 document (public)
  const doc = openApiDocument(publicUrl);
  const docBody = JSON.stringify(doc);
  const docEtag = jsonEtag(docBody);
  router.get('/v1/openapi.json', (req, res) => {
    res.set({ ETag: docEtag, 'Cache-Control': 'no-cache' });
    if (ifNoneMatchMatches(req, docEtag)) {
      res.status(304).end();
      return;
    }
    res.type('application/json').send(docBody);
  });

  // GET /api/v1/whoami → { principal: { kind, name }, teams }
  router.get('/v1/whoami', requireCaller(), async (_req, res) => {
    res.set('Cache-Control', 'no-store').json(await v1.whoami(principalOf(res)));
  });

  // GET /api/v1/teams/:teamId/packs → { packs } (a token limited to packs sees only those)
  router.get(`${team}/packs`, requireTeam('team.read'), async (req, res) => {
    const { teamId } = packPathSchema.pick({ teamId: true }).parse(req.params);
    sendRevalidated(req, res, { packs: await v1.packSummaries(principalOf(res), teamId) });
  });

  // GET …/packs/:pack/channels/:channel → { pack, channel, version, manifest }
  router.get(`${team}/packs/:pack/channels/:channel`, requireTeam('team.read'), async (req, res) => {
    const q = channelPathSchema.parse(req.params);
    sendRevalidated(req, res, await v1.channelManifest(storage, versions, principalOf(res), q.teamId, q.pack, q.channel));
  });

  // GET …/versions/:number → { manifest } (its review state can change, so revalidated too)
  router.get(version, requireTeam('team.read'), async (req, res) => {
    const q = versionPathSchema.parse(req.params);
    sendRevalidated(req, res, { manifest: await v1.versionManifest(storage, versions, principalOf(res), q.teamId, q.pack, q.number) });
  });

  // GET …/versions/:number/source → the canonical JSON source (immutable)
  router.get(`${version}/source`, requireTeam('artifacts.download'), async (req, res) => {
    const q = versionPathSchema.parse(req.params);
    await sendDownload(req, res, await v1.findSource(versions, principalOf(res), q.teamId, q.pack, q.number));
  });

  // GET …/versions/:number/artifacts/:target/:format → the artifact's bytes (immutable)
  router.get(`${version}/artifacts/:target/:format`, requireTeam('artifacts.download'), async (req, res) => {
    const q = artifactPathSchema.parse(req.params);
    await sendDownload(req, res, await v1.findDownload(versions, principalOf(res), q.teamId, q.pack, q.number, q.target, q.format));
  });

  router.use('/v1', problemNotFound(publicUrl));
  router.use('/v1', problemErrorHandler(publicUrl, ctx.logger));
  return router;
}
