import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { webhooksQueryKey } from './list-webhooks';

/** `DELETE /api/teams/:teamId/webhooks/:webhookId` → 204 (admin); its deliveries go with it. */
export const deleteWebhook = (teamId: string, id: string) => apiRequest<void>(`/api/teams/${teamId}/webhooks/${id}`, { method: 'DELETE' });

export function useDeleteWebhook(teamId: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (id: string) => deleteWebhook(teamId, id), onSettled: () => qc.invalidateQueries({ queryKey: webhooksQueryKey(teamId) }) });
}
