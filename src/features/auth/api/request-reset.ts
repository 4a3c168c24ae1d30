import { useMutation } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';

/** `POST /api/auth/password-reset { email }` → 202, the same answer whether or not the address has an account. */
export const requestReset = (body: { email: string }) => apiRequest<{ message: string }>('/api/auth/password-reset', { method: 'POST', body });

export function useRequestReset() {
  return useMutation({ mutationFn: requestReset });
}
