/**
 * API bodies for target profiles. The profile itself is shared/bake/profile.ts (ProfileSchema);
 * a replace carries the version the editor loaded, so a stale save is refused instead of lost.
 */
import { z } from 'zod';
import type { Profile } from '../bake/profile';

export const profileReplaceSchema = z.object({
  profile: z.unknown(),
  version: z.number({ error: 'version: must be the version number you loaded' }).int().min(1, { error: 'version: must be at least 1' }),
});

export interface StoredProfileDto {
  id: string;
  teamId: string;
  profile: Profile;
  position: number;
  version: number;
  updatedAt: string;
}
