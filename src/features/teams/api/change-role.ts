import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { Role } from '../../../../shared/schemas/roles';
import { membersQueryKey } from './list-members';

/** `PATCH /api/teams/:teamId/members/:userId { role }` → 204 (admin). */
export const changeRole = (teamId: string, userId: string, role: Role) =>
  apiRequest<void>(`/api/teams/${teamId}/members/${encodeURIComponent(userId)}`, { method: 'PATCH', body: { role } });

export function useChangeRole(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, role }: { userId: string; role: Role }) => changeRole(teamId, userId, role),
    onSettled: () => qc.invalidateQueries({ queryKey: membersQueryKey(teamId) }),
  });
}
