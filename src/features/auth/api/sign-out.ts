import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import { meQueryKey } from './get-me';

/** `POST /api/auth/sign-out` (this device) or `/api/auth/sign-out-everywhere` (every device) → 204. */
export function signOut(everywhere = false): Promise<void> {
  return apiRequest<void>(everywhere ? '/api/auth/sign-out-everywhere' : '/api/auth/sign-out', { method: 'POST' });
}

export function useSignOut() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (everywhere: boolean = false) => signOut(everywhere),
    onSuccess: () => {
      qc.setQueryData(meQueryKey, null);
      void qc.resetQueries({ predicate: (q) => q.queryKey[0] !== 'auth' });
    },
  });
}
