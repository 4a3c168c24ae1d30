import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { membersQueryKey } from './list-members';

/** `DELETE /api/teams/:teamId/members/:userId` → 204 (admin). */
export const removeMember = (teamId: string, userId: string) => apiRequest<void>(`/api/teams/${teamId}/members/${encodeURIComponent(userId)}`, { method: 'DELETE' });

export function useRemoveMember(teamId: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (userId: string) => removeMember(teamId, userId), onSettled: () => qc.invalidateQueries({ queryKey: membersQueryKey(teamId) }) });
}
