/**
 * API bodies and DTOs of packs and their curves, shared by the server (validation at the edge) and the
 * client (errors beside the field). Messages start with the field name. A curve's document is
 * validated with shared/curve's parseCurveDocument on the server, so its issues name the document path.
 */
import { z } from 'zod';
import type { CurveDocument } from '../curve/types';

export const PACK_SLUG = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;
export const TAG = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;

const packName = z.string({ error: 'name: is required' }).trim().min(1, { error: 'name: is required' }).max(80, { error: 'name: at most 80 characters' });
const packSlug = z
  .string({ error: 'slug: is required' })
  .trim()
  .min(2, { error: 'slug: at least 2 characters' })
  .max(60, { error: 'slug: at most 60 characters' })
  .regex(PACK_SLUG, { error: 'slug: lower-case letters, digits and single hyphens, like jump-arcs' });
const description = z.string({ error: 'description: must be text' }).max(2000, { error: 'description: at most 2000 characters' });
const frameRate = z
  .number({ error: 'frameRate: must be a number of frames per second' })
  .positive({ error: 'frameRate: must be more than 0' })
  .max(1000, { error: 'frameRate: at most 1000 frames per second' });
const tags = z
  .array(
    z.string({ error: 'tags: each tag must be text' }).trim().toLowerCase().max(32, { error: 'tags: each tag at most 32 characters' }).regex(TAG, { error: 'tags: lower-case letters, digits and hyphens' }),
    { error: 'tags: must be a list of words' },
  )
  .max(20, { error: 'tags: at most 20 tags' })
  .transform((t) => [...new Set(t)]);

export const packCreateSchema = z.strictObject({
  name: packName,
  slug: packSlug.optional(),
  description: description.default(''),
  frameRate: frameRate.default(60),
  tags: tags.default([]),
});
export type PackCreateInput = z.input<typeof packCreateSchema>;

/** Rename, re-describe, re-tag, archive or restore. Slugs never change (build servers name them). */
export const packUpdateSchema = z.strictObject({
  name: packName.optional(),
  description: description.optional(),
  frameRate: frameRate.optional(),
  tags: tags.optional(),
  archived: z.boolean({ error: 'archived: must be true or false' }).optional(),
});
export type PackUpdateInput = z.input<typeof packUpdateSchema>;

export const curveCreateSchema = z.object({ document: z.unknown() });
export const curveReplaceSchema = z.object({
  document: z.unknown(),
  revision: z.number({ error: 'revision: must be the revision number you loaded' }).int({ error: 'revision: must be a whole number' }).min(1, { error: 'revision: must be at least 1' }),
});
export const curveReorderSchema = z.object({
  curveIds: z.array(z.uuid({ error: 'curveIds: each entry must be a curve id' }), { error: 'curveIds: must list every curve of the pack in the new order' }),
});
export const curveTransferSchema = z.object({
  toPack: packSlug.describe('the slug of the pack to move or copy to'),
  name: z.string().trim().min(1, { error: 'name: is required' }).max(200, { error: 'name: at most 200 characters' }).optional(),
});

/** Turns a name into a slug candidate: "Jump arcs" → "jump-arcs". */
export function slugify(name: string): string {
  return name.normalize('NFKD').toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'pack';
}

export interface PackDto {
  id: string;
  teamId: string;
  name: string;
  slug: string;
  description: string;
  frameRate: number;
  tags: string[];
  archived: boolean;
  curveCount: number;
  updatedAt: string;
}

export interface CurveDto {
  id: string;
  packId: string;
  name: string;
  document: CurveDocument;
  position: number;
  revision: number;
  updatedAt: string;
}
