import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { PackCreateInput, PackDto, PackUpdateInput } from '../../../../shared/schemas/packs';
import { packsQueryKey } from './packs-keys';

/** `POST /api/teams/:teamId/packs` (create) or `PATCH …/packs/:slug` (rename, describe, archive, restore). */
export const savePack = (teamId: string, input: { slug?: string; body: PackCreateInput | PackUpdateInput }) =>
  input.slug
    ? apiRequest<{ pack: PackDto }>(`/api/teams/${teamId}/packs/${encodeURIComponent(input.slug)}`, { method: 'PATCH', body: input.body })
    : apiRequest<{ pack: PackDto }>(`/api/teams/${teamId}/packs`, { method: 'POST', body: input.body });

export function useSavePack(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { slug?: string; body: PackCreateInput | PackUpdateInput }) => savePack(teamId, input),
    onSettled: () => qc.invalidateQueries({ queryKey: packsQueryKey(teamId) }),
  });
}
