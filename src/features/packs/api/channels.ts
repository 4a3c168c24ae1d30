import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client';
import type { ChannelDto } from '../../../../shared/schemas/channels';

const base = (teamId: string, slug: string) => `/api/teams/${teamId}/packs/${encodeURIComponent(slug)}/channels`;
const key = (teamId: string, slug: string) => ['teams', teamId, 'packs', slug, 'channels'] as const;

/** `GET …/packs/:slug/channels` → each channel with its version and every move, newest first. */
export function useChannels(teamId: string | undefined, slug: string) {
  return useQuery({
    queryKey: key(teamId ?? '', slug),
    queryFn: ({ signal }) => apiRequest<{ channels: ChannelDto[] }>(base(teamId ?? '', slug), { signal }).then((r) => r.channels),
    enabled: Boolean(teamId),
  });
}

/** `PUT …/channels/:name { version }`: a release (leads and admins; approved versions only). */
export function useRelease(teamId: string, slug: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { channel: string; version: number }) =>
      apiRequest<{ channel: ChannelDto }>(`${base(teamId, slug)}/${encodeURIComponent(input.channel)}`, { method: 'PUT', body: { version: input.version } }).then((r) => r.channel),
    onSettled: () => qc.invalidateQueries({ queryKey: key(teamId, slug) }),
  });
}
