import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { Role } from '../../../../shared/schemas/roles';
import { invitationsQueryKey, type PendingInvitation } from './list-invitations';

/** `POST /api/teams/:teamId/invitations { email, role }` → 201; the invitation is mailed (admin). */
export const invite = (teamId: string, body: { email: string; role: Role }) =>
  apiRequest<{ invitation: PendingInvitation }>(`/api/teams/${teamId}/invitations`, { method: 'POST', body });

export function useInvite(teamId: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (body: { email: string; role: Role }) => invite(teamId, body), onSuccess: () => qc.invalidateQueries({ queryKey: invitationsQueryKey(teamId) }) });
}
