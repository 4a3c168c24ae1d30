import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { Profile } from '../../../../shared/bake/profile';
import type { StoredProfileDto } from '../../../../shared/schemas/profiles';
import { profilesQueryKey } from './list-profiles';

/**
 * Create (`POST /api/teams/:teamId/profiles`) or replace (`PUT …/profiles/:id { profile, version }`,
 * 409 version_conflict when someone saved in between) a target profile (engineers and admins).
 */
export const saveProfile = (teamId: string, input: { id?: string; version?: number; profile: Profile }) =>
  input.id
    ? apiRequest<{ profile: StoredProfileDto }>(`/api/teams/${teamId}/profiles/${input.id}`, { method: 'PUT', body: { profile: input.profile, version: input.version } })
    : apiRequest<{ profile: StoredProfileDto }>(`/api/teams/${teamId}/profiles`, { method: 'POST', body: input.profile });

export function useSaveProfile(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { id?: string; version?: number; profile: Profile }) => saveProfile(teamId, input),
    onSettled: () => qc.invalidateQueries({ queryKey: profilesQueryKey(teamId) }),
  });
}
