import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { SignInInput } from '../../../../shared/schemas/accounts';
import { meQueryKey, type Me } from './get-me';

/** `POST /api/auth/sign-in` → 200 with the person (the session cookie is set by the server). */
export function signIn(body: SignInInput): Promise<Me> {
  return apiRequest<Me>('/api/auth/sign-in', { method: 'POST', body });
}

export function useSignIn() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (me) => {
      // keep observers attached (the top bar's): set who is signed in, forget everything else
      qc.setQueryData(meQueryKey, me);
      void qc.resetQueries({ predicate: (q) => q.queryKey[0] !== 'auth' });
    },
  });
}
