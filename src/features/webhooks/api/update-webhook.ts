import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { UpdateWebhookInput, WebhookDto } from '../../../../shared/schemas/webhooks';
import { webhooksQueryKey } from './list-webhooks';

/** `PATCH /api/teams/:teamId/webhooks/:webhookId { url?, events?, description?, active? }` → { webhook } (admin). */
export const updateWebhook = (teamId: string, id: string, body: UpdateWebhookInput) =>
  apiRequest<{ webhook: WebhookDto }>(`/api/teams/${teamId}/webhooks/${id}`, { method: 'PATCH', body });

export function useUpdateWebhook(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { id: string; body: UpdateWebhookInput }) => updateWebhook(teamId, v.id, v.body),
    onSettled: () => qc.invalidateQueries({ queryKey: webhooksQueryKey(teamId) }),
  });
}
