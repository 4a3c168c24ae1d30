/** Channels of a pack: named pointers at approved versions; moving one is a release. */
import { z } from 'zod';

export const CHANNEL_NAME = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;

export const channelNameSchema = z
  .string({ error: 'channel: is required' })
  .min(2, { error: 'channel: at least 2 characters' })
  .max(40, { error: 'channel: at most 40 characters' })
  .regex(CHANNEL_NAME, { error: 'channel: lower-case letters, digits and single hyphens, like shipping' });

export const releaseSchema = z.object({
  version: z.number({ error: 'version: the version number to release' }).int({ error: 'version: must be a whole number' }).min(1, { error: 'version: must be at least 1' }),
});

export interface ChannelMoveDto {
  from: number | null;
  to: number;
  by: { id: string; name: string } | null;
  at: string;
}

export interface ChannelDto {
  name: string;
  version: number;
  /** Newest first. */
  history: ChannelMoveDto[];
}
