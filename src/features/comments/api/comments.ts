import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { CommentDto, CommentInput } from '../../../../shared/schemas/comments';
import type { CurveDocument } from '../../../../shared/curve/types';

const url = (teamId: string, slug: string, number: number) => `/api/teams/${teamId}/packs/${encodeURIComponent(slug)}/versions/${number}/comments`;
const key = (teamId: string, slug: string, number: number) => ['teams', teamId, 'packs', slug, 'versions', number, 'comments'] as const;

/** `GET …/versions/:number/comments` → oldest first. */
export function useComments(teamId: string, slug: string, number: number) {
  return useQuery({ queryKey: key(teamId, slug, number), queryFn: ({ signal }) => apiRequest<{ comments: CommentDto[] }>(url(teamId, slug, number), { signal }).then((r) => r.comments) });
}

/** `POST …/versions/:number/comments { body, curve?, time? }` → 201 { comment }; 400 names body, curve or time. */
export function useAddComment(teamId: string, slug: string, number: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CommentInput) => apiRequest<{ comment: CommentDto }>(url(teamId, slug, number), { method: 'POST', body: input }).then((r) => r.comment),
    onSettled: () => qc.invalidateQueries({ queryKey: key(teamId, slug, number) }),
  });
}

/** The curves of the version with their domains, read from its stored source (`…/artifacts/:id`, immutable). */
export function useVersionCurves(sourceUrl: string | null) {
  return useQuery({
    queryKey: ['artifact', sourceUrl, 'curves'] as const,
    // no abort signal: the source is small and immutable, and an aborted download only makes the artifact
    // route log a premature close
    queryFn: () =>
      apiRequest<{ curves: CurveDocument[] }>(sourceUrl!).then((r) =>
        r.curves.map((c) => ({ name: c.name, from: c.keys[0]?.time ?? 0, to: c.keys[c.keys.length - 1]?.time ?? 0 }))),
    enabled: Boolean(sourceUrl),
    staleTime: Infinity,
  });
}
