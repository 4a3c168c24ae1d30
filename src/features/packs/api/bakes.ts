import { useCallback } from 'react';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { BakeDto } from '../../../../shared/schemas/versions';
import { versionsQueryKey } from './versions';

const base = (teamId: string, slug: string) => `/api/teams/${teamId}/packs/${encodeURIComponent(slug)}`;
export const bakesQueryKey = (teamId: string, slug: string) => ['teams', teamId, 'packs', slug, 'bakes'] as const;
/** How often an unfinished bake is asked about (the worker reports progress per target). */
export const BAKE_POLL_MS = 1000;
const open = (b: BakeDto) => b.state === 'queued' || b.state === 'baking';

/** `GET …/packs/:slug/bakes` → queued, baking and failed bakes, newest first; polled while one is unfinished. */
export function bakesQueryOptions(teamId: string, slug: string) {
  return queryOptions({
    queryKey: bakesQueryKey(teamId, slug),
    queryFn: ({ signal }) => apiRequest<{ bakes: BakeDto[] }>(`${base(teamId, slug)}/bakes`, { signal }).then((r) => r.bakes),
    refetchInterval: (q) => (q.state.data?.some(open) ? BAKE_POLL_MS : false),
  });
}

export function useBakes(teamId: string | undefined, slug: string) {
  return useQuery({ ...bakesQueryOptions(teamId ?? '', slug), enabled: Boolean(teamId) });
}

/** `GET …/bakes/:id` → one bake in any state; polled until it is done or failed. */
export function useBake(teamId: string, slug: string, id: string | null) {
  return useQuery({
    queryKey: [...bakesQueryKey(teamId, slug), id] as const,
    queryFn: ({ signal }) => apiRequest<{ bake: BakeDto }>(`${base(teamId, slug)}/bakes/${id}`, { signal }).then((r) => r.bake),
    enabled: Boolean(id),
    refetchInterval: (q) => (q.state.data && !open(q.state.data) ? false : BAKE_POLL_MS),
  });
}

/** `POST …/versions { changelog }` → 202 { bake }: the source is stored and the bake queued. */
export function useProposeBake(teamId: string, slug: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (changelog: string) => apiRequest<{ bake: BakeDto }>(`${base(teamId, slug)}/versions`, { method: 'POST', body: { changelog } }).then((r) => r.bake),
    onSettled: () => qc.invalidateQueries({ queryKey: bakesQueryKey(teamId, slug) }),
  });
}

/** `POST …/bakes/:id/retry` → 202 { bake } back in the queue (a failed bake only). */
export function useRetryBake(teamId: string, slug: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => apiRequest<{ bake: BakeDto }>(`${base(teamId, slug)}/bakes/${id}/retry`, { method: 'POST' }).then((r) => r.bake),
    onSettled: () => qc.invalidateQueries({ queryKey: bakesQueryKey(teamId, slug) }),
  });
}

/** When a bake leaves the open list (done), its version is new: refresh the versions. */
export function useVersionsRefresh(teamId: string, slug: string) {
  const qc = useQueryClient();
  return useCallback(() => qc.invalidateQueries({ queryKey: versionsQueryKey(teamId, slug) }), [qc, teamId, slug]);
}
