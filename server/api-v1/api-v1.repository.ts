/**
 * Reads the build-server API needs beyond the packs, versions and channels services: the latest version
 * number and the channel pointers of many packs at once (two queries, not two per pack).
 */
import { fn, col } from 'sequelize';
import { Channel, PackVersion } from '../models';

export async function latestVersionNumbers(packIds: string[]): Promise<Map<string, number>> {
  if (packIds.length === 0) return new Map();
  const rows = (await PackVersion.findAll({
    attributes: ['packId', [fn('MAX', col('number')), 'latest']],
    where: { packId: packIds },
    group: ['packId'],
    raw: true,
  })) as unknown as { packId: string; latest: number | string }[];
  return new Map(rows.map((r) => [r.packId, Number(r.latest)]));
}

/** Channel pointers per pack id, by name. */
export async function channelPointers(packIds: string[]): Promise<Map<string, { name: string; version: number }[]>> {
  const out = new Map<string, { name: string; version: number }[]>();
  if (packIds.length === 0) return out;
  const channels = await Channel.findAll({ where: { packId: packIds }, order: [['name', 'ASC']] });
  if (channels.length === 0) return out;
  const versions = await PackVersion.findAll({ where: { id: [...new Set(channels.map((c) => c.versionId))] }, attributes: ['id', 'number'] });
  const numbers = new Map(versions.map((v) => [v.id, v.number]));
  for (const c of channels) {
    const list = out.get(c.packId as string) ?? [];
    list.push({ name: c.name, version: numbers.get(c.versionId)! });
    out.set(c.packId as string, list);
  }
  return out;
}
