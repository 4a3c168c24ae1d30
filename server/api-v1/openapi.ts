/**
 * The OpenAPI 3.1 document of /api/v1, generated from the zod schemas in shared/schemas/api-v1.ts with
 * @asteasolutions/zod-to-openapi (OpenApiGeneratorV31). V1_ROUTES lists every route in Express form; the
 * test (tests/api/api-v1-openapi.test.ts) checks it against both the router and the document.
 */
import { z } from 'zod';
import { OpenAPIRegistry, OpenApiGeneratorV31, extendZodWithOpenApi, type RouteConfig } from '@asteasolutions/zod-to-openapi';
import {
  PROBLEM_MEDIA_TYPE, channelParam, channelResponseSchema, formatParam, manifestSchema, packListSchema, packParam, problemSchema,
  targetParam, teamIdParam, versionManifestResponseSchema, versionNumberParam, whoamiSchema,
} from '../../shared/schemas/api-v1';

extendZodWithOpenApi(z);

/** Every /api/v1 route as Express writes it (method, path under /api). */
export const V1_ROUTES = [
  'GET /api/v1/openapi.json',
  'GET /api/v1/whoami',
  'GET /api/v1/teams/:teamId/packs',
  'GET /api/v1/teams/:teamId/packs/:pack/channels/:channel',
  'GET /api/v1/teams/:teamId/packs/:pack/versions/:number',
  'GET /api/v1/teams/:teamId/packs/:pack/versions/:number/source',
  'GET /api/v1/teams/:teamId/packs/:pack/versions/:number/artifacts/:target/:format',
] as const;

/** "/api/v1/teams/:teamId/packs" → "/api/v1/teams/{teamId}/packs" (OpenAPI path templating). */
export const openApiPath = (expressPath: string) => expressPath.replace(/:(\w+)/g, '{$1}');

const header = (description: string, schema: { type: 'string' | 'integer' } = { type: 'string' }) => ({ description, schema });
const HEADERS = {
  etag: header('Entity tag (RFC 9110 §8.8.3); send it back in If-None-Match'),
  cacheControl: header('Cache-Control (RFC 9111 §5.2)'),
  sha256: header('SHA-256 of the bytes, lower-case hex'),
  rateLimit: header('Remaining quota (IETF RateLimit header fields, draft 8)'),
  rateLimitPolicy: header('The quota policy (IETF RateLimit header fields, draft 8)'),
  retryAfter: header('Seconds to wait (RFC 9110 §10.2.3)', { type: 'integer' }),
  location: header('A presigned S3 GET URL, valid for a short time'),
};

export function openApiDocument(publicUrl: string) {
  const registry = new OpenAPIRegistry();
  registry.registerComponent('securitySchemes', 'serviceToken', { type: 'http', scheme: 'bearer', description: 'A service token (tgt_…) made by a team admin on the tokens page. Read-only; may be limited to some packs.' });
  registry.registerComponent('securitySchemes', 'session', { type: 'apiKey', in: 'cookie', name: 'tangentry_session', description: 'The session cookie of a signed-in person (the browser).' });
  const Problem = registry.register('Problem', problemSchema.meta({ description: 'RFC 9457 problem details' }));
  // the shared schemas were made before extendZodWithOpenApi ran: register copies (.meta() returns a new
  // schema), and build the envelopes on the registered manifest so it appears once, by $ref
  const Manifest = registry.register('Manifest', manifestSchema.meta({ description: 'A pack version: curves, targets, artifacts' }));
  const Whoami = registry.register('Whoami', whoamiSchema.meta({}));
  const PackList = registry.register('PackList', packListSchema.meta({}));
  const ChannelRead = registry.register('ChannelRead', channelResponseSchema.extend({ manifest: Manifest }));
  const VersionRead = registry.register('VersionManifest', versionManifestResponseSchema.extend({ manifest: Manifest }));

  const problem = (description: string) => ({ description, headers: { RateLimit: HEADERS.rateLimit }, content: { [PROBLEM_MEDIA_TYPE]: { schema: Problem } } });
  const limited = { description: 'Too many requests from this token, person or address (code rate_limited)', headers: { 'Retry-After': HEADERS.retryAfter, RateLimit: HEADERS.rateLimit, 'RateLimit-Policy': HEADERS.rateLimitPolicy }, content: { [PROBLEM_MEDIA_TYPE]: { schema: Problem } } };
  const guarded = {
    400: problem('A path parameter is malformed (code invalid_request, errors per field)'),
    401: problem('No credentials, or a malformed, unknown or revoked token (code unauthenticated)'),
    404: problem('No such team among yours, pack (or not one this token may read), channel, version, target or format (code not_found)'),
    429: limited,
  };
  const security: Record<string, string[]>[] = [{ serviceToken: [] }, { session: [] }];
  const ifNoneMatch = z.object({ 'if-none-match': z.string().optional().meta({ description: 'Entity tags you already have (RFC 9110 §13.1.2)' }) });
  const teamParams = z.object({ teamId: teamIdParam.meta({ description: 'The team id (whoami lists yours)' }) });
  const packParams = teamParams.extend({ pack: packParam.meta({ description: 'Pack slug', example: 'menu-transitions' }) });
  const versionParams = packParams.extend({ number: versionNumberParam.meta({ description: 'Version number (v3 → 3)', example: 1 }) });
  const revalidated = (description: string, schema: z.ZodType) => ({
    description, headers: { ETag: HEADERS.etag, 'Cache-Control': { ...HEADERS.cacheControl, description: 'no-cache: revalidate with If-None-Match every time' } }, content: { 'application/json': { schema } },
  });
  const notModified = { description: 'Not modified: the If-None-Match tag is current (RFC 9110 §15.4.5); no body', headers: { ETag: HEADERS.etag } };
  const bytes = {
    200: { description: 'The bytes', headers: { ETag: { ...HEADERS.etag, description: 'Strong: "<sha256>"' }, 'X-Content-SHA256': HEADERS.sha256, 'Cache-Control': { ...HEADERS.cacheControl, description: 'private, max-age=31536000, immutable' }, 'Content-Disposition': header('attachment; filename="<pack>-v<n>-<file>"') }, content: { 'application/octet-stream': { schema: { type: 'string' as const, format: 'binary' } } } },
    302: { description: 'When the server is configured with TANGENTRY_DOWNLOAD_REDIRECT=presigned: go to a presigned S3 URL for the bytes', headers: { Location: HEADERS.location, ETag: HEADERS.etag, 'X-Content-SHA256': HEADERS.sha256 } },
    304: { description: 'Not modified: you have these bytes (If-None-Match matched); the bucket is not read', headers: { ETag: HEADERS.etag } },
  };

  const routes: (RouteConfig & { path: string })[] = [
    {
      method: 'get', path: '/api/v1/openapi.json', operationId: 'getOpenApi', summary: 'This document', tags: ['meta'], security: [],
      responses: { 200: { description: 'The OpenAPI 3.1 document', content: { 'application/json': { schema: { type: 'object' } } } }, 429: limited },
    },
    {
      method: 'get', path: '/api/v1/whoami', operationId: 'whoami', summary: 'Who the credentials belong to, and their teams', tags: ['meta'], security,
      responses: { 200: { description: 'The caller', content: { 'application/json': { schema: Whoami } } }, 401: guarded[401], 429: limited },
    },
    {
      method: 'get', path: '/api/v1/teams/{teamId}/packs', operationId: 'listPacks', summary: "The team's packs with their latest version and channels", tags: ['packs'], security,
      request: { params: teamParams, headers: ifNoneMatch },
      responses: { 200: revalidated('The packs this caller may read', PackList), 304: notModified, ...guarded },
    },
    {
      method: 'get', path: '/api/v1/teams/{teamId}/packs/{pack}/channels/{channel}', operationId: 'readChannel', summary: 'The version a channel points at, with its manifest', tags: ['packs'], security,
      request: { params: packParams.extend({ channel: channelParam.meta({ description: 'Channel name', example: 'shipping' }) }), headers: ifNoneMatch },
      responses: { 200: revalidated('The channel and the manifest of its version', ChannelRead), 304: notModified, ...guarded },
    },
    {
      method: 'get', path: '/api/v1/teams/{teamId}/packs/{pack}/versions/{number}', operationId: 'readVersion', summary: "A version's manifest: curves, targets, artifacts with sizes and SHA-256", tags: ['packs'], security,
      request: { params: versionParams, headers: ifNoneMatch },
      responses: { 200: revalidated('The manifest (its state can change with a review, so it is revalidated)', VersionRead), 304: notModified, ...guarded },
    },
    {
      method: 'get', path: '/api/v1/teams/{teamId}/packs/{pack}/versions/{number}/source', operationId: 'downloadSource', summary: "Download a version's source (every curve document, canonical JSON)", tags: ['downloads'], security,
      request: { params: versionParams, headers: ifNoneMatch },
      responses: { ...bytes, ...guarded },
    },
    {
      method: 'get', path: '/api/v1/teams/{teamId}/packs/{pack}/versions/{number}/artifacts/{target}/{format}', operationId: 'downloadArtifact', summary: 'Download one artifact of a version by target and format', tags: ['downloads'], security,
      request: {
        params: versionParams.extend({
          target: targetParam.meta({ description: "The target's file stem (manifest targets[].target)", example: 'handheld' }),
          format: formatParam.meta({ description: 'An artifact format the version has: json, binary, css, c, ts, gltf …', example: 'binary' }),
        }),
        headers: ifNoneMatch,
      },
      responses: { ...bytes, ...guarded },
    },
  ];
  for (const r of routes) registry.registerPath(r);

  return new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: '3.1.0',
    info: {
      title: 'Tangentry build-server API',
      version: '1.0.0',
      description: 'Read packs, channels and version manifests, and download baked tables, with a service token. Errors are RFC 9457 problem details. See docs/api.md.',
    },
    servers: [{ url: publicUrl }],
    tags: [{ name: 'meta', description: 'The document and the caller' }, { name: 'packs', description: 'Packs, channels, manifests' }, { name: 'downloads', description: 'Immutable bytes, cached by SHA-256' }],
  });
}
