/**
 * The pull state kept in the output folder (`.tangentry-pull.json`): per channel the ETag and body of the
 * last channel read (sent back as If-None-Match; a 304 reuses the body), per file the SHA-256 and version
 * last written. It is a cache: a missing or unreadable state only means the next pull checks everything
 * again (files already on disk whose SHA-256 matches are still not downloaded).
 */
import { readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { z } from 'zod';
import { channelResponseSchema } from '../../shared/schemas/api-v1';
import { writeFileAtomic } from './atomic-write';

export const STATE_FILE = '.tangentry-pull.json';

const fileStateSchema = z.object({
  pack: z.string(),
  channel: z.string(),
  version: z.number().int(),
  target: z.string(),
  format: z.string(),
  sha256: z.string().regex(/^[0-9a-f]{64}$/),
  size: z.number().int().nonnegative(),
});
const channelStateSchema = z.object({ etag: z.string(), body: channelResponseSchema });

export const pullStateSchema = z.object({
  format: z.literal('tangentry.pull-state'),
  version: z.literal(1),
  /** Server origin and team the channel ETags belong to; another server or team starts the channels afresh. */
  server: z.string(),
  team: z.string(),
  channels: z.record(z.string(), channelStateSchema),
  files: z.record(z.string(), fileStateSchema),
});
export type PullState = z.infer<typeof pullStateSchema>;
export type FileState = z.infer<typeof fileStateSchema>;
export type ChannelState = z.infer<typeof channelStateSchema>;

export const channelKey = (pack: string, channel: string) => `${pack}/${channel}`;

export function emptyState(server: string, team: string): PullState {
  return { format: 'tangentry.pull-state', version: 1, server, team, channels: {}, files: {} };
}

/**
 * Reads the state of `dir`. Returns an empty state (and why, for a warning) when there is none, it cannot be
 * parsed, or it was written for another server or team (then only the file entries are kept: they are
 * checked against the bytes on disk anyway).
 */
export async function readState(dir: string, server: string, team: string): Promise<{ state: PullState; warning: string | null }> {
  let text: string;
  try {
    text = await readFile(join(dir, STATE_FILE), 'utf8');
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return { state: emptyState(server, team), warning: null };
    throw err;
  }
  let parsed;
  try {
    parsed = pullStateSchema.safeParse(JSON.parse(text));
  } catch {
    parsed = null;
  }
  if (!parsed?.success) return { state: emptyState(server, team), warning: `${STATE_FILE} is not a pull state; checking every file again` };
  const s = parsed.data;
  if (s.server !== server || s.team !== team) return { state: { ...emptyState(server, team), files: s.files }, warning: null };
  return { state: s, warning: null };
}

export function serializeState(state: PullState): string {
  return `${JSON.stringify(state, null, 2)}\n`;
}

export async function writeState(dir: string, state: PullState): Promise<void> {
  await writeFileAtomic(dir, STATE_FILE, new TextEncoder().encode(serializeState(state)));
}
