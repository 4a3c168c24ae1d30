import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { WebhookDto } from '../../../../shared/schemas/webhooks';
import { webhooksQueryKey } from './list-webhooks';

/** `POST /api/teams/:teamId/webhooks/:webhookId/rotate-secret` → { webhook, secret }; the new secret is shown only now. */
export const rotateSecret = (teamId: string, id: string) =>
  apiRequest<{ webhook: WebhookDto; secret: string }>(`/api/teams/${teamId}/webhooks/${id}/rotate-secret`, { method: 'POST' });

export function useRotateSecret(teamId: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (id: string) => rotateSecret(teamId, id), onSettled: () => qc.invalidateQueries({ queryKey: webhooksQueryKey(teamId) }) });
}
