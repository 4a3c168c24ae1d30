import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';

/** `GET /api/teams/:teamId/tokens` → the team's service tokens, never their secrets (admin). */
export interface ServiceToken {
  id: string;
  name: string;
  packSlugs: string[] | null;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

export const listTokens = (teamId: string, signal?: AbortSignal) => apiRequest<{ tokens: ServiceToken[] }>(`/api/teams/${teamId}/tokens`, { signal });

export const tokensQueryKey = (teamId: string) => ['teams', teamId, 'tokens'] as const;

export function tokensQueryOptions(teamId: string) {
  return queryOptions({ queryKey: tokensQueryKey(teamId), queryFn: ({ signal }) => listTokens(teamId, signal).then((r) => r.tokens) });
}

export function useTokens(teamId: string) {
  return useQuery(tokensQueryOptions(teamId));
}
