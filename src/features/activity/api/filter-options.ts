import { useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';

/** The people and packs of the team, for the table's filters (`GET …/members`, `GET …/packs`). */
export function usePeople(teamId: string) {
  return useQuery({
    queryKey: ['teams', teamId, 'activity', 'people'] as const,
    queryFn: ({ signal }) => apiRequest<{ members: { userId: string; name: string }[] }>(`/api/teams/${teamId}/members`, { signal }).then((r) => r.members),
  });
}

export function usePackSlugs(teamId: string) {
  return useQuery({
    queryKey: ['teams', teamId, 'activity', 'packs'] as const,
    queryFn: ({ signal }) => apiRequest<{ packs: { slug: string; name: string }[] }>(`/api/teams/${teamId}/packs`, { signal }).then((r) => r.packs),
  });
}
