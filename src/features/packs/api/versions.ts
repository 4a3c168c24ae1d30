import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { ReviewInput, VersionComparison, VersionDto } from '../../../../shared/schemas/versions';

const base = (teamId: string, slug: string) => `/api/teams/${teamId}/packs/${encodeURIComponent(slug)}/versions`;
export const versionsQueryKey = (teamId: string, slug: string) => ['teams', teamId, 'packs', slug, 'versions'] as const;

/** `GET …/packs/:slug/versions` → newest first. */
export function versionsQueryOptions(teamId: string, slug: string) {
  return queryOptions({
    queryKey: versionsQueryKey(teamId, slug),
    queryFn: ({ signal }) => apiRequest<{ versions: VersionDto[] }>(base(teamId, slug), { signal }).then((r) => r.versions),
  });
}

export function useVersions(teamId: string | undefined, slug: string) {
  return useQuery({ ...versionsQueryOptions(teamId ?? '', slug), enabled: Boolean(teamId) });
}

/** `GET …/versions/:number` → the version with its artifacts. */
export function useVersion(teamId: string | undefined, slug: string, number: number) {
  return useQuery({
    queryKey: [...versionsQueryKey(teamId ?? '', slug), number] as const,
    queryFn: ({ signal }) => apiRequest<{ version: VersionDto }>(`${base(teamId ?? '', slug)}/${number}`, { signal }).then((r) => r.version),
    enabled: Boolean(teamId) && Number.isSafeInteger(number),
  });
}

/** Proposing (`POST …/versions` → 202 { bake }) and following the bake are in ./bakes.ts. */

/** Where the browser downloads an artifact (the server streams it from the bucket). */
export const artifactUrl = (teamId: string, slug: string, number: number, artifactId: string) => `${base(teamId, slug)}/${number}/artifacts/${artifactId}`;

/** `GET …/versions/:number/compare[?against=n]` → what changed since the version before (or `against`). */
export function useComparison(teamId: string | undefined, slug: string, number: number, against: number | null) {
  return useQuery({
    queryKey: [...versionsQueryKey(teamId ?? '', slug), number, 'compare', against] as const,
    queryFn: ({ signal }) => apiRequest<{ comparison: VersionComparison }>(`${base(teamId ?? '', slug)}/${number}/compare?against=${against}`, { signal }).then((r) => r.comparison),
    enabled: Boolean(teamId) && against !== null,
  });
}

/** `POST …/versions/:number/reviews { decision, comment }` (leads and admins). */
export function useReviewVersion(teamId: string, slug: string, number: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: ReviewInput) => apiRequest<{ version: VersionDto }>(`${base(teamId, slug)}/${number}/reviews`, { method: 'POST', body: input }).then((r) => r.version),
    onSettled: () => qc.invalidateQueries({ queryKey: versionsQueryKey(teamId, slug) }),
  });
}
