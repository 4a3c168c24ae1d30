/**
 * Channels: a lead (channels.release) moves a named pointer of a pack to an approved version — a release.
 * Every move is kept; rolling back is moving the channel back to an earlier approved version.
 */
import type { Principal } from '../auth/principal';
import { conflict } from '../http/errors';
import { getPack } from '../packs/packs.service';
import { getVersion } from '../versions/versions.service';
import type { ChannelDto } from '../../shared/schemas/channels';
import * as repo from './channels.repository';

export async function listChannels(p: Principal, teamId: string, slug: string): Promise<ChannelDto[]> {
  const pack = await getPack(p, teamId, slug);
  return repo.listChannels(pack.id);
}

export async function release(p: Principal, teamId: string, slug: string, channel: string, number: number, userId: string): Promise<ChannelDto> {
  const pack = await getPack(p, teamId, slug);
  const v = await getVersion(p, teamId, slug, number);
  if (v.state !== 'approved') {
    throw conflict(`v${number} of "${slug}" is ${v.state}, not approved; a lead approves a version before it can be released.`, 'not_approved');
  }
  return repo.moveChannel(pack.id, channel, v.id, userId);
}
