import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { CreateTokenInput } from '../../../../shared/schemas/accounts';
import { tokensQueryKey, type ServiceToken } from './list-tokens';

/** `POST /api/teams/:teamId/tokens { name, packSlugs? }` → 201 { token, secret }; the secret is shown only now. */
export const createToken = (teamId: string, body: CreateTokenInput) =>
  apiRequest<{ token: ServiceToken; secret: string }>(`/api/teams/${teamId}/tokens`, { method: 'POST', body });

export function useCreateToken(teamId: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (body: CreateTokenInput) => createToken(teamId, body), onSuccess: () => qc.invalidateQueries({ queryKey: tokensQueryKey(teamId) }) });
}
