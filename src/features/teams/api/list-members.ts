import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { Role } from '../../../../shared/schemas/roles';

/** `GET /api/teams/:teamId/members` → every member with their role in this team. */
export interface Member {
  userId: string;
  name: string;
  email: string;
  role: Role;
  joinedAt: string;
}

export const listMembers = (teamId: string, signal?: AbortSignal) => apiRequest<{ members: Member[] }>(`/api/teams/${teamId}/members`, { signal });

export const membersQueryKey = (teamId: string) => ['teams', teamId, 'members'] as const;

export function membersQueryOptions(teamId: string) {
  return queryOptions({ queryKey: membersQueryKey(teamId), queryFn: ({ signal }) => listMembers(teamId, signal).then((r) => r.members) });
}

export function useMembers(teamId: string) {
  return useQuery(membersQueryOptions(teamId));
}
