import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { CurveDto } from '../../../../shared/schemas/packs';
import { packsQueryKey } from './packs-keys';

const base = (teamId: string, slug: string) => `/api/teams/${teamId}/packs/${encodeURIComponent(slug)}`;

/** `POST …/packs/:slug/reorder { curveIds }` → the curves in the new order. */
export const reorderCurves = (teamId: string, slug: string, curveIds: string[]) =>
  apiRequest<{ curves: CurveDto[] }>(`${base(teamId, slug)}/reorder`, { method: 'POST', body: { curveIds } });

/** `POST …/curves/:id/move { toPack }` or `…/copy { toPack, name? }`. */
export const transferCurve = (teamId: string, slug: string, input: { curveId: string; toPack: string; mode: 'move' | 'copy'; name?: string }) =>
  apiRequest<{ curve: CurveDto }>(`${base(teamId, slug)}/curves/${input.curveId}/${input.mode}`, { method: 'POST', body: { toPack: input.toPack, ...(input.name ? { name: input.name } : {}) } });

/** Reorder, move and copy all change pack contents: refresh every pack of the team afterwards. */
export function useReorderCurves(teamId: string, slug: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (ids: string[]) => reorderCurves(teamId, slug, ids), onSettled: () => qc.invalidateQueries({ queryKey: packsQueryKey(teamId) }) });
}

export function useTransferCurve(teamId: string, slug: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { curveId: string; toPack: string; mode: 'move' | 'copy'; name?: string }) => transferCurve(teamId, slug, input),
    onSettled: () => qc.invalidateQueries({ queryKey: packsQueryKey(teamId) }),
  });
}
