import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { StoredProfileDto } from '../../../../shared/schemas/profiles';

/** `GET /api/teams/:teamId/profiles` → the team's target profiles in order (every member reads). */
export const listProfiles = (teamId: string, signal?: AbortSignal) =>
  apiRequest<{ profiles: StoredProfileDto[] }>(`/api/teams/${teamId}/profiles`, { signal });

export const profilesQueryKey = (teamId: string) => ['teams', teamId, 'profiles'] as const;

export function profilesQueryOptions(teamId: string) {
  return queryOptions({ queryKey: profilesQueryKey(teamId), queryFn: ({ signal }) => listProfiles(teamId, signal).then((r) => r.profiles) });
}

export function useProfiles(teamId: string | undefined) {
  return useQuery({ ...profilesQueryOptions(teamId ?? ''), enabled: Boolean(teamId) });
}
