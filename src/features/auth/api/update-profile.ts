import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { meQueryKey, type Me } from './get-me';

/** `PATCH /api/auth/me { name }` → the updated profile. */
export const updateProfile = (body: { name: string }) => apiRequest<Me>('/api/auth/me', { method: 'PATCH', body });

export function useUpdateProfile() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updateProfile, onSuccess: (me) => qc.setQueryData(meQueryKey, me) });
}
