import { useInfiniteQuery, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { MarkReadInput, NoticesDto } from '../../../../shared/schemas/notifications';

const KEY = ['me', 'notifications'] as const;

/** `GET /api/me/notifications` → the unread count and the 30 newest; polled each minute while the page is open. */
export function useNotices(enabled: boolean) {
  return useQuery({ queryKey: [...KEY, 'latest'] as const, queryFn: ({ signal }) => apiRequest<NoticesDto>('/api/me/notifications', { signal }), enabled, refetchInterval: 60_000, staleTime: 15_000 });
}

/** Every page of notices, older ones fetched with the `older` cursor. */
export function useNoticePages() {
  return useInfiniteQuery({
    queryKey: [...KEY, 'pages'] as const,
    initialPageParam: '',
    queryFn: ({ pageParam, signal }) => apiRequest<NoticesDto>(`/api/me/notifications${pageParam ? `?before=${encodeURIComponent(pageParam)}` : ''}`, { signal }),
    getNextPageParam: (last) => last.older ?? undefined,
  });
}

/** `POST /api/me/notifications/read { ids } | { all: true }` → { marked, unread }. */
export function useMarkRead() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: MarkReadInput) => apiRequest<{ marked: number; unread: number }>('/api/me/notifications/read', { method: 'POST', body: input }),
    onSettled: () => qc.invalidateQueries({ queryKey: KEY }),
  });
}
