import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { PackDto } from '../../../../shared/schemas/packs';
import { packsQueryKey } from './packs-keys';

/** `GET /api/teams/:teamId/packs` → the team's packs, archived last (every member reads). */
export const listPacks = (teamId: string, signal?: AbortSignal) => apiRequest<{ packs: PackDto[] }>(`/api/teams/${teamId}/packs`, { signal });

export function packsQueryOptions(teamId: string) {
  return queryOptions({ queryKey: packsQueryKey(teamId), queryFn: ({ signal }) => listPacks(teamId, signal).then((r) => r.packs) });
}

export function usePacks(teamId: string | undefined) {
  return useQuery({ ...packsQueryOptions(teamId ?? ''), enabled: Boolean(teamId) });
}
