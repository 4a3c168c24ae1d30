import { useMutation } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';

/** `POST /api/auth/password-reset/complete { token, password }` → 204. */
export const completeReset = (body: { token: string; password: string }) => apiRequest<void>('/api/auth/password-reset/complete', { method: 'POST', body });

export function useCompleteReset() {
  return useMutation({ mutationFn: completeReset });
}
