import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { InboxDto } from '../../../../shared/schemas/inbox';

/** `GET /api/me/inbox` → reviews to do, the person's proposals and recent releases in their teams. */
export function getInbox({ signal }: { signal?: AbortSignal } = {}): Promise<InboxDto> {
  return apiRequest<InboxDto>('/api/me/inbox', { signal });
}

export const inboxQueryKey = ['me', 'inbox'] as const;

export function inboxQueryOptions() {
  return queryOptions({ queryKey: inboxQueryKey, queryFn: ({ signal }) => getInbox({ signal }), staleTime: 30_000 });
}

/** Only asks when someone is signed in (`enabled`). */
export function useInbox(enabled: boolean) {
  return useQuery({ ...inboxQueryOptions(), enabled });
}
