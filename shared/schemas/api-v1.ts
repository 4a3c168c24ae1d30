/**
 * The build-server API under /api/v1: path parameters (validated at the edge) and every response body,
 * as zod schemas. The server answers with these shapes and server/api-v1/openapi.ts turns them into the
 * OpenAPI 3.1 document at /api/v1/openapi.json. Pure: no Node, no DOM.
 */
import { z } from 'zod';

const slug = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;

/** Path parameters. Messages start with the parameter's name (the problem detail's `errors[].field`). */
export const teamIdParam = z.uuid({ error: 'teamId: must be a team id (a UUID)' });
export const packParam = z.string().regex(slug, { error: 'pack: a pack slug, lower-case letters, digits and single hyphens' }).max(60, { error: 'pack: at most 60 characters' });
export const channelParam = z.string().regex(slug, { error: 'channel: a channel name, lower-case letters, digits and single hyphens' }).max(40, { error: 'channel: at most 40 characters' });
export const versionNumberParam = z.coerce
  .number({ error: 'number: must be a version number' })
  .int({ error: 'number: must be a whole version number' })
  .min(1, { error: 'number: must be at least 1' })
  .max(2_147_483_647, { error: 'number: too large' });
export const targetParam = z.string().regex(slug, { error: 'target: a target file stem, like handheld or handheld-tight' }).max(80, { error: 'target: at most 80 characters' });
export const formatParam = z.string().regex(/^[a-z0-9]+$/, { error: 'format: an artifact format such as json, binary or css' }).max(20, { error: 'format: at most 20 characters' });

export const packPathSchema = z.object({ teamId: teamIdParam, pack: packParam });
export const channelPathSchema = packPathSchema.extend({ channel: channelParam });
export const versionPathSchema = packPathSchema.extend({ number: versionNumberParam });
export const artifactPathSchema = versionPathSchema.extend({ target: targetParam, format: formatParam });

export const sha256Hex = z.string().regex(/^[0-9a-f]{64}$/).describe('SHA-256 of the bytes, lower-case hex');

export const whoamiSchema = z.object({
  principal: z.object({
    kind: z.enum(['token', 'user']).describe('a service token or a signed-in person'),
    name: z.string().describe("the token's or the person's name"),
  }),
  teams: z.array(z.object({ id: z.uuid(), slug: z.string(), name: z.string() })).describe('a token sees its one team; a person every team they belong to'),
});
export type WhoamiDto = z.infer<typeof whoamiSchema>;

export const channelPointerSchema = z.object({ name: z.string(), version: z.number().int() });

export const packSummarySchema = z.object({
  slug: z.string(),
  name: z.string(),
  description: z.string(),
  frameRate: z.number(),
  tags: z.array(z.string()),
  archived: z.boolean(),
  latestVersion: z.number().int().nullable().describe('the highest version number, null before the first proposal'),
  channels: z.array(channelPointerSchema),
});
export const packListSchema = z.object({ packs: z.array(packSummarySchema) });
export type PackSummaryV1 = z.infer<typeof packSummarySchema>;

export const artifactEntrySchema = z.object({
  format: z.string().describe('json, binary, css, c, ts, gltf … as stored for this version'),
  fileName: z.string(),
  mediaType: z.string(),
  size: z.number().int().describe('bytes'),
  sha256: sha256Hex,
  url: z.string().describe('download path under /api/v1, relative to the server'),
});

export const manifestTargetSchema = z.object({
  name: z.string().describe('the target profile name'),
  target: z.string().describe('the file stem of the name, used in download URLs (handheld-tight)'),
  kernel: z.string().nullable().describe('linear or hermite; null when the profile no longer exists'),
  layout: z.string().nullable(),
  encoding: z.string().nullable(),
  tolerance: z.object({ mode: z.string(), value: z.number() }).nullable(),
  failures: z.array(z.object({ curve: z.string(), error: z.string() })).describe('curves that could not be baked for this target, with the reason'),
  artifacts: z.array(artifactEntrySchema),
});

export const manifestSchema = z.object({
  pack: z.string().describe('pack slug'),
  version: z.number().int(),
  state: z.string().describe('proposed, approved or changes-requested'),
  changelog: z.string(),
  createdAt: z.string().describe('ISO 8601'),
  source: z.object({ sha256: sha256Hex, size: z.number().int(), url: z.string() }),
  curves: z.array(z.string()).describe('curve names in pack order'),
  targets: z.array(manifestTargetSchema),
});
export type ManifestDto = z.infer<typeof manifestSchema>;
export type ManifestTargetDto = z.infer<typeof manifestTargetSchema>;

export const versionManifestResponseSchema = z.object({ manifest: manifestSchema });
export const channelResponseSchema = z.object({ pack: z.string(), channel: z.string(), version: z.number().int(), manifest: manifestSchema });

/** RFC 9457 problem details, with our stable `code` and per-field `errors` on validation failures. */
export const problemSchema = z.object({
  type: z.string().describe('URI naming the problem type'),
  title: z.string(),
  status: z.number().int(),
  detail: z.string(),
  code: z.string().describe('stable machine-readable code: unauthenticated, forbidden, not_found, invalid_request, rate_limited …'),
  instance: z.string().optional(),
  errors: z.array(z.object({ field: z.string(), detail: z.string() })).optional(),
});
export type ProblemDto = z.infer<typeof problemSchema>;

export const PROBLEM_MEDIA_TYPE = 'application/problem+json';
