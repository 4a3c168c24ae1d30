import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { CurveDto, PackDto } from '../../../../shared/schemas/packs';
import { packQueryKey } from './packs-keys';

/** `GET /api/teams/:teamId/packs/:slug` → the pack and its curves in order. */
export const getPack = (teamId: string, slug: string, signal?: AbortSignal) =>
  apiRequest<{ pack: PackDto; curves: CurveDto[] }>(`/api/teams/${teamId}/packs/${encodeURIComponent(slug)}`, { signal });

export function packQueryOptions(teamId: string, slug: string) {
  return queryOptions({ queryKey: packQueryKey(teamId, slug), queryFn: ({ signal }) => getPack(teamId, slug, signal) });
}

export function usePack(teamId: string | undefined, slug: string) {
  return useQuery({ ...packQueryOptions(teamId ?? '', slug), enabled: Boolean(teamId) });
}
