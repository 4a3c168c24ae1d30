/** Channels and their moves in PostgreSQL. The only module that touches Channel and ChannelMove. */
import { QueryTypes } from 'sequelize';
import { Channel, ChannelMove, PackVersion, User } from '../models';
import type { ChannelDto } from '../../shared/schemas/channels';

async function toDto(c: Channel, numbers: Map<string, number>): Promise<ChannelDto> {
  const moves = await ChannelMove.findAll({ where: { channelId: c.id }, order: [['createdAt', 'DESC'], ['id', 'DESC']] });
  const users = new Map((await User.findAll({ where: { id: [...new Set(moves.map((m) => m.movedBy).filter((x): x is string => !!x))] } })).map((u) => [u.id, u]));
  return {
    name: c.name,
    version: numbers.get(c.versionId)!,
    history: moves.map((m) => ({
      from: m.fromVersionId ? numbers.get(m.fromVersionId)! : null,
      to: numbers.get(m.toVersionId)!,
      by: m.movedBy && users.get(m.movedBy) ? { id: m.movedBy, name: users.get(m.movedBy)!.name } : null,
      at: m.createdAt.toISOString(),
    })),
  };
}

async function versionNumbers(packId: string): Promise<Map<string, number>> {
  return new Map((await PackVersion.findAll({ where: { packId }, attributes: ['id', 'number'] })).map((v) => [v.id, v.number]));
}

export async function listChannels(packId: string): Promise<ChannelDto[]> {
  const rows = await Channel.findAll({ where: { packId }, order: [['name', 'ASC']] });
  const numbers = await versionNumbers(packId);
  return Promise.all(rows.map((r) => toDto(r, numbers)));
}

/**
 * Points the channel (created if new) at `versionId` and records the move, in one transaction with the
 * pack row locked (SELECT … FOR UPDATE): two leads releasing at once take turns, so the second sees the
 * first's move as its `from` — and a channel that does not exist yet is created once, not twice (locking
 * only the channel row left nothing to lock for a new channel: the second insert hit the unique index, a 500).
 * Moving to the version it already points at records nothing.
 */
export async function moveChannel(packId: string, name: string, versionId: string, movedBy: string): Promise<ChannelDto> {
  await Channel.sequelize!.transaction(async (transaction) => {
    await Channel.sequelize!.query('SELECT id FROM packs WHERE id = :id FOR UPDATE', { replacements: { id: packId }, type: QueryTypes.SELECT, transaction });
    let c = await Channel.findOne({ where: { packId, name }, transaction, lock: transaction.LOCK.UPDATE });
    const from = c?.versionId ?? null;
    if (from === versionId) return;
    if (c) {
      c.versionId = versionId;
      await c.save({ transaction });
    } else {
      c = await Channel.create({ packId, name, versionId }, { transaction });
    }
    await ChannelMove.create({ channelId: c.id, fromVersionId: from, toVersionId: versionId, movedBy }, { transaction });
  });
  const c = await Channel.findOne({ where: { packId, name } });
  return toDto(c!, await versionNumbers(packId));
}
