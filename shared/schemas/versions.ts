/**
 * Pack versions: the propose body, and what the API answers. A version is immutable: its source (every
 * curve document, canonical JSON) and its artifacts (per target profile: JSON table, binary pack, CSS for
 * web targets) are stored objects named by their SHA-256.
 */
import { z } from 'zod';

export const proposeVersionSchema = z.object({
  changelog: z
    .string({ error: 'changelog: say what changed in this version' })
    .trim()
    .min(1, { error: 'changelog: say what changed in this version' })
    .max(5000, { error: 'changelog: at most 5000 characters' }),
});
export type ProposeVersionInput = z.input<typeof proposeVersionSchema>;

export const ARTIFACT_FORMATS = ['source', 'json', 'binary', 'css'] as const;
export type ArtifactFormat = (typeof ARTIFACT_FORMATS)[number];

/** Per target profile: how the bake of the pack went (BakeReport totals) and which curves failed and why. */
export interface BakeSummary {
  profile: string;
  curves: number;
  failed: number;
  entries: number;
  bytes: number;
  overCap: number;
  /** Largest certified error / tolerance over the pack's curves (≤ 1 when every curve is within budget). */
  worstRatio: number;
  failures: { curve: string; error: string }[];
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
  createdAt: string;
}
