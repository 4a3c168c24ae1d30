import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { PackSummaryV1 } from '../../../../shared/schemas/api-v1';

/** `GET /api/v1/teams/:teamId/packs` (with the person's session) → real pack and channel names for the examples. */
export const getTeamPacksV1 = (teamId: string, signal?: AbortSignal) => apiRequest<{ packs: PackSummaryV1[] }>(`/api/v1/teams/${teamId}/packs`, { signal });

export function teamPacksV1QueryOptions(teamId: string) {
  return queryOptions({ queryKey: ['api-v1', 'teams', teamId, 'packs'], queryFn: ({ signal }) => getTeamPacksV1(teamId, signal).then((r) => r.packs) });
}

export function useTeamPacksV1(teamId: string) {
  return useQuery(teamPacksV1QueryOptions(teamId));
}
