import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { invitationsQueryKey } from './list-invitations';

/** `DELETE /api/teams/:teamId/invitations/:invitationId` → 204 (admin); the link stops working. */
export const withdrawInvitation = (teamId: string, id: string) => apiRequest<void>(`/api/teams/${teamId}/invitations/${id}`, { method: 'DELETE' });

export function useWithdrawInvitation(teamId: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (id: string) => withdrawInvitation(teamId, id), onSettled: () => qc.invalidateQueries({ queryKey: invitationsQueryKey(teamId) }) });
}
