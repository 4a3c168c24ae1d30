import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { tokensQueryKey } from './list-tokens';

/** `DELETE /api/teams/:teamId/tokens/:tokenId` → 204 (admin); the token stops working at once. */
export const revokeToken = (teamId: string, id: string) => apiRequest<void>(`/api/teams/${teamId}/tokens/${id}`, { method: 'DELETE' });

export function useRevokeToken(teamId: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (id: string) => revokeToken(teamId, id), onSettled: () => qc.invalidateQueries({ queryKey: tokensQueryKey(teamId) }) });
}
