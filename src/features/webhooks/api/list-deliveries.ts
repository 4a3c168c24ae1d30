import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { DeliveriesPageDto } from '../../../../shared/schemas/webhooks';

/** `GET /api/teams/:teamId/webhooks/:webhookId/deliveries?page&perPage` → newest first (admin). */
export const listDeliveries = (teamId: string, webhookId: string, page: number, perPage: number, signal?: AbortSignal) =>
  apiRequest<DeliveriesPageDto>(`/api/teams/${teamId}/webhooks/${webhookId}/deliveries?page=${page}&perPage=${perPage}`, { signal });

export const deliveriesQueryKey = (teamId: string, webhookId: string) => ['teams', teamId, 'webhooks', webhookId, 'deliveries'] as const;

export function deliveriesQueryOptions(teamId: string, webhookId: string, page: number, perPage: number) {
  return queryOptions({
    queryKey: [...deliveriesQueryKey(teamId, webhookId), page, perPage],
    queryFn: ({ signal }) => listDeliveries(teamId, webhookId, page, perPage, signal),
    // while something is still pending, look again every 2 s
    refetchInterval: (q) => (q.state.data?.deliveries.some((d) => d.state === 'pending') ? 2000 : false),
  });
}

export function useDeliveries(teamId: string, webhookId: string, page: number, perPage = 10) {
  return useQuery(deliveriesQueryOptions(teamId, webhookId, page, perPage));
}
