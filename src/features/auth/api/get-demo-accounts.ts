import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { Role } from '../../../../shared/schemas/roles';

/** `GET /api/auth/demo-accounts` → listed only when the server runs the embedded default. */
export type DemoAccounts =
  | { enabled: false }
  | { enabled: true; password: string; accounts: { email: string; name: string; role: Role; summary: string; teams: Record<string, Role> }[] };

export const getDemoAccounts = ({ signal }: { signal?: AbortSignal } = {}) => apiRequest<DemoAccounts>('/api/auth/demo-accounts', { signal });

export function demoAccountsQueryOptions() {
  return queryOptions({ queryKey: ['auth', 'demo-accounts'] as const, queryFn: ({ signal }) => getDemoAccounts({ signal }), staleTime: Infinity });
}

export function useDemoAccounts() {
  return useQuery(demoAccountsQueryOptions());
}
