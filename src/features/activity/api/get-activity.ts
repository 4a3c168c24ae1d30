import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { ActivityPage } from '../../../../shared/schemas/activity';

/** The table's filters and page position (a cursor from the last answer). */
export interface ActivityParams {
  type?: string;
  pack?: string;
  actor?: string;
  before?: string;
  after?: string;
  limit?: number;
}

function query(p: ActivityParams): string {
  const q = new URLSearchParams();
  for (const [k, v] of Object.entries({ ...p, count: 'true' })) if (v !== undefined && v !== '') q.set(k, String(v));
  return q.toString();
}

/** `GET /api/teams/:teamId/activity?…` → a page, newest first, with cursors for older and newer pages. */
export const getActivity = (teamId: string, p: ActivityParams, signal?: AbortSignal) =>
  apiRequest<ActivityPage>(`/api/teams/${teamId}/activity?${query(p)}`, { signal });

export function useActivity(teamId: string, p: ActivityParams) {
  // keep the last page on screen while the next one loads, so "Older" / "Newer" do not flash empty
  return useQuery({ queryKey: ['teams', teamId, 'activity', p] as const, queryFn: ({ signal }) => getActivity(teamId, p, signal), placeholderData: keepPreviousData });
}
