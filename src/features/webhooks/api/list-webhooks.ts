import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { WebhookDto, WebhookPolicyDto } from '../../../../shared/schemas/webhooks';

/** `GET /api/teams/:teamId/webhooks` → the team's webhooks (never their secrets) and the target policy (admin). */
export const listWebhooks = (teamId: string, signal?: AbortSignal) =>
  apiRequest<{ webhooks: WebhookDto[]; policy: WebhookPolicyDto }>(`/api/teams/${teamId}/webhooks`, { signal });

export const webhooksQueryKey = (teamId: string) => ['teams', teamId, 'webhooks'] as const;

export function webhooksQueryOptions(teamId: string) {
  return queryOptions({ queryKey: webhooksQueryKey(teamId), queryFn: ({ signal }) => listWebhooks(teamId, signal) });
}

export function useWebhooks(teamId: string) {
  return useQuery(webhooksQueryOptions(teamId));
}
