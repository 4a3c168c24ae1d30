import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { profilesQueryKey } from './list-profiles';

/** `DELETE /api/teams/:teamId/profiles/:id` → 204 (engineers and admins). */
export const deleteProfile = (teamId: string, id: string) => apiRequest<void>(`/api/teams/${teamId}/profiles/${id}`, { method: 'DELETE' });

export function useDeleteProfile(teamId: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (id: string) => deleteProfile(teamId, id), onSuccess: () => qc.invalidateQueries({ queryKey: profilesQueryKey(teamId) }) });
}
