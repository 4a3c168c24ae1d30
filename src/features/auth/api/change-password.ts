import { useMutation } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';

/** `POST /api/auth/password { currentPassword, newPassword }` → 204; other devices are signed out. */
export const changePassword = (body: { currentPassword: string; newPassword: string }) => apiRequest<void>('/api/auth/password', { method: 'POST', body });

export function useChangePassword() {
  return useMutation({ mutationFn: changePassword });
}
