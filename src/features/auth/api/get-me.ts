import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest, isApiError } from '../../../lib/api-client';
import type { Role } from '../../../../shared/schemas/roles';

/** `GET /api/auth/me` → the signed-in person and their teams; 401 → null (signed out). */
export interface MyTeam {
  id: string;
  name: string;
  slug: string;
  studioName: string;
  role: Role;
}
export interface Me {
  user: { id: string; email: string; name: string; studioName: string };
  teams: MyTeam[];
}

export async function getMe({ signal }: { signal?: AbortSignal } = {}): Promise<Me | null> {
  try {
    const me = await apiRequest<Me>('/api/auth/me', { signal });
    return me && typeof me === 'object' && 'user' in me && Array.isArray(me.teams) ? me : null;
  } catch (error) {
    if (isApiError(error) && (error.status === 401 || error.status === 403)) return null;
    throw error;
  }
}

export const meQueryKey = ['auth', 'me'] as const;

export function meQueryOptions() {
  return queryOptions({ queryKey: meQueryKey, queryFn: ({ signal }) => getMe({ signal }), staleTime: 60_000 });
}

export function useMe() {
  return useQuery(meQueryOptions());
}
