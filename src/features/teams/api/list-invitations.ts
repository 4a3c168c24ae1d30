import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { Role } from '../../../../shared/schemas/roles';

/** `GET /api/teams/:teamId/invitations` → open invitations (admin). */
export interface PendingInvitation {
  id: string;
  email: string;
  role: Role;
  expiresAt: string;
  createdAt: string;
}

export const listInvitations = (teamId: string, signal?: AbortSignal) => apiRequest<{ invitations: PendingInvitation[] }>(`/api/teams/${teamId}/invitations`, { signal });

export const invitationsQueryKey = (teamId: string) => ['teams', teamId, 'invitations'] as const;

export function invitationsQueryOptions(teamId: string) {
  return queryOptions({ queryKey: invitationsQueryKey(teamId), queryFn: ({ signal }) => listInvitations(teamId, signal).then((r) => r.invitations) });
}

export function useInvitations(teamId: string, enabled = true) {
  return useQuery({ ...invitationsQueryOptions(teamId), enabled });
}
