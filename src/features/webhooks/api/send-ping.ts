import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { DeliveryDto } from '../../../../shared/schemas/webhooks';
import { deliveriesQueryKey } from './list-deliveries';
import { webhooksQueryKey } from './list-webhooks';

/** `POST /api/teams/:teamId/webhooks/:webhookId/ping` → 202 { delivery }: a `ping` event to this webhook, sent now. */
export const sendPing = (teamId: string, webhookId: string) => apiRequest<{ delivery: DeliveryDto }>(`/api/teams/${teamId}/webhooks/${webhookId}/ping`, { method: 'POST' });

export function useSendPing(teamId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (webhookId: string) => sendPing(teamId, webhookId),
    onSettled: (_d, _e, webhookId) => Promise.all([qc.invalidateQueries({ queryKey: deliveriesQueryKey(teamId, webhookId) }), qc.invalidateQueries({ queryKey: webhooksQueryKey(teamId) })]),
  });
}
