import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';

/** `POST /api/invitations/accept { token, name?, password }` → 200; the session cookie is set. */
export const acceptInvitation = (body: { token: string; name?: string; password: string }) =>
  apiRequest<{ joined: true }>('/api/invitations/accept', { method: 'POST', body });

export function useAcceptInvitation() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: acceptInvitation, onSuccess: () => qc.resetQueries() });
}
