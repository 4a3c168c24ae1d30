import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';

/** `GET /api/outbox` → messages the embedded mail catcher caught (admins; 404 when mail goes to a real server). */
export interface OutboxMessage {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  links: string[];
}

export const getOutbox = (signal?: AbortSignal) => apiRequest<{ messages: OutboxMessage[] }>('/api/outbox', { signal });

export function outboxQueryOptions() {
  return queryOptions({ queryKey: ['outbox'] as const, queryFn: ({ signal }) => getOutbox(signal).then((r) => r.messages), refetchInterval: 5_000, staleTime: 0 });
}

export function useOutbox() {
  return useQuery(outboxQueryOptions());
}
