import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { Role } from '../../../../shared/schemas/roles';

/** `GET /api/invitations/:token` → what the accept page shows; 404 when used, withdrawn or expired. */
export interface InvitationView {
  email: string;
  role: Role;
  teamName: string;
  studioName: string;
  expiresAt: string;
  accountExists: boolean;
}

export const getInvitation = (token: string, signal?: AbortSignal) => apiRequest<InvitationView>(`/api/invitations/${encodeURIComponent(token)}`, { signal });

export function invitationQueryOptions(token: string) {
  return queryOptions({ queryKey: ['invitation', token] as const, queryFn: ({ signal }) => getInvitation(token, signal), retry: false });
}

export function useInvitation(token: string) {
  return useQuery(invitationQueryOptions(token));
}
