import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { CreateWebhookInput, WebhookDto } from '../../../../shared/schemas/webhooks';
import { webhooksQueryKey } from './list-webhooks';

/** `POST /api/teams/:teamId/webhooks { url, events, description }` → 201 { webhook, secret }; the secret is shown only now. */
export const createWebhook = (teamId: string, body: CreateWebhookInput) =>
  apiRequest<{ webhook: WebhookDto; secret: string }>(`/api/teams/${teamId}/webhooks`, { method: 'POST', body });

export function useCreateWebhook(teamId: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (body: CreateWebhookInput) => createWebhook(teamId, body), onSuccess: () => qc.invalidateQueries({ queryKey: webhooksQueryKey(teamId) }) });
}
