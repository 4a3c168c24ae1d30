/**
 * Pack versions: the propose body, and what the API answers. A version is immutable: its source (every
 * curve document, canonical JSON) and its artifacts (per target profile: JSON table, binary pack, CSS for
 * web targets) are stored objects named by their SHA-256.
 */
import type { PackTotals } from '../bake/bake';
import { z } from 'zod';
import type { CurveDocument } from '../curve/types';

export const proposeVersionSchema = z.object({
  changelog: z
    .string({ error: 'changelog: say what changed in this version' })
    .trim()
    .min(1, { error: 'changelog: say what changed in this version' })
    .max(5000, { error: 'changelog: at most 5000 characters' }),
});
export type ProposeVersionInput = z.input<typeof proposeVersionSchema>;

/**
 * What a version stores: its source, and per target the JSON tables, the binary pack, the C99 header and
 * the TypeScript module (each with the reference evaluator), glTF 2.0 (animation samplers, buffer inline)
 * and, for CSS targets, linear() easings.
 */
export const ARTIFACT_FORMATS = ['source', 'json', 'binary', 'c', 'ts', 'gltf', 'css'] as const;
export type ArtifactFormat = (typeof ARTIFACT_FORMATS)[number];

/** Per target profile: how the bake of the pack went (BakeReport totals) and which curves failed and why. */
export interface BakeSummary extends Omit<PackTotals, 'methods'> {
  failures: { curve: string; error: string }[];
  /** Curves baked but left out of one output that cannot hold them (glTF needs times ≥ 0, strictly increasing). */
  omitted?: { curve: string; format: ArtifactFormat; error: string }[];
}

/**
 * A proposal being baked in the background (server/jobs). It is not a version: the version appears, with
 * every artifact stored, when the bake is `done` (then `version` names its number).
 */
export const BAKE_STATES = ['queued', 'baking', 'failed', 'done'] as const;
export type BakeState = (typeof BAKE_STATES)[number];

export interface BakeDto {
  id: string;
  packId: string;
  state: BakeState;
  changelog: string;
  proposedBy: { id: string; name: string } | null;
  curveCount: number;
  /** Target profiles baked so far, of all the team's targets at the time of the proposal. */
  progress: { done: number; total: number };
  /** Why the last attempt failed: the target and curve being baked or stored (when known) and the reason. */
  failure: { target: string | null; curve: string | null; reason: string } | null;
  attempts: number;
  /** The version's number once the bake is done. */
  version: number | null;
  source: { key: string; sha256: string; size: number };
  createdAt: string;
  updatedAt: string;
}

export interface ArtifactDto {
  id: string;
  /** null for the version's source. */
  profileName: string | null;
  format: ArtifactFormat;
  fileName: string;
  mediaType: string;
  key: string;
  sha256: string;
  size: number;
}

export interface VersionDto {
  id: string;
  packId: string;
  number: number;
  changelog: string;
  state: string;
  proposedBy: { id: string; name: string } | null;
  curveCount: number;
  source: { key: string; sha256: string; size: number };
  bakeSummary: BakeSummary[];
  artifacts: ArtifactDto[];
  /** Oldest first; the state follows the latest. */
  reviews: ReviewDto[];
  createdAt: string;
}

export const REVIEW_DECISIONS = ['approve', 'request-changes'] as const;
export type ReviewDecision = (typeof REVIEW_DECISIONS)[number];

export interface ReviewDto {
  id: string;
  decision: ReviewDecision;
  comment: string;
  reviewer: { id: string; name: string } | null;
  createdAt: string;
}

/** A review: approving may be silent; asking for changes must say which. */
export const reviewSchema = z
  .object({
    decision: z.enum(REVIEW_DECISIONS, { error: 'decision: must be approve or request-changes' }),
    comment: z.string({ error: 'comment: must be text' }).trim().max(5000, { error: 'comment: at most 5000 characters' }).default(''),
  })
  .superRefine((r, ctx) => {
    if (r.decision === 'request-changes' && !r.comment) ctx.addIssue({ code: 'custom', path: ['comment'], message: 'comment: say what should change' });
  });
export type ReviewInput = z.input<typeof reviewSchema>;

export interface CurveChange {
  name: string;
  unit: string;
  /** max |new(t) − old(t)| over the union of both domains, by dense evaluation. */
  maxDeviation: number;
  /** Time (s) where it occurs. */
  at: number;
  domain: [number, number];
  keysBefore: number;
  keysAfter: number;
  /** Both documents, for an overlay plot. */
  before: CurveDocument;
  after: CurveDocument;
}

export interface VersionComparison {
  from: number;
  to: number;
  added: string[];
  removed: string[];
  changed: CurveChange[];
  unchanged: string[];
  targets: { profile: string; bytesBefore: number | null; bytesAfter: number | null; worstRatioBefore: number | null; worstRatioAfter: number | null }[];
}

export const compareQuerySchema = z.object({
  against: z.coerce.number({ error: 'against: must be a version number' }).int({ error: 'against: must be a whole version number' }).min(1, { error: 'against: must be at least 1' }).optional(),
});
