import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { DeliveryDto } from '../../../../shared/schemas/webhooks';
import { deliveriesQueryKey } from './list-deliveries';
import { webhooksQueryKey } from './list-webhooks';

/** `POST …/webhooks/:webhookId/deliveries/:deliveryId/redeliver` → 202 { delivery }: the same event and body, sent now. */
export const redeliver = (teamId: string, webhookId: string, deliveryId: string) =>
  apiRequest<{ delivery: DeliveryDto }>(`/api/teams/${teamId}/webhooks/${webhookId}/deliveries/${deliveryId}/redeliver`, { method: 'POST' });

export function useRedeliver(teamId: string, webhookId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (deliveryId: string) => redeliver(teamId, webhookId, deliveryId),
    onSettled: () => Promise.all([qc.invalidateQueries({ queryKey: deliveriesQueryKey(teamId, webhookId) }), qc.invalidateQueries({ queryKey: webhooksQueryKey(teamId) })]),
  });
}
