/** Background bakes in PostgreSQL (migration 0009). The only module that touches VersionBake. */
import { Op, type Transaction } from 'sequelize';
import { Pack, PackVersion, User, VersionBake } from '../models';
import type { Profile } from '../../shared/bake';
import type { BakeDto, VersionDto } from '../../shared/schemas/versions';
import { insertVersionIn, findVersionById, type NewVersion } from './versions.repository';

async function toBake(b: VersionBake, transaction?: Transaction): Promise<BakeDto> {
  const [user, version] = await Promise.all([
    b.proposedBy ? User.findByPk(b.proposedBy, { transaction }) : null,
    b.versionId ? PackVersion.findByPk(b.versionId, { transaction }) : null,
  ]);
  return {
    id: b.id, packId: b.packId as string, state: b.state, changelog: b.changelog,
    proposedBy: user ? { id: user.id, name: user.name } : null, curveCount: b.curveCount,
    progress: { done: b.progressDone, total: b.progressTotal }, failure: b.failure ?? null, attempts: b.attempts,
    version: version?.number ?? null, source: { key: b.sourceKey, sha256: b.sourceSha256, size: b.sourceSize },
    createdAt: b.createdAt.toISOString(), updatedAt: b.updatedAt.toISOString(),
  };
}

export interface NewBake {
  packId: string;
  proposedBy: string | null;
  changelog: string;
  curveCount: number;
  source: { key: string; sha256: string; size: number };
  profiles: Profile[];
}

export async function insertBake(b: NewBake): Promise<BakeDto> {
  const row = await VersionBake.create({
    packId: b.packId, proposedBy: b.proposedBy, changelog: b.changelog, curveCount: b.curveCount,
    sourceKey: b.source.key, sourceSha256: b.source.sha256, sourceSize: b.source.size, profiles: b.profiles, progressTotal: b.profiles.length,
  });
  return toBake(row);
}

export async function setJobId(id: string, jobId: string | null): Promise<void> {
  await VersionBake.update({ jobId }, { where: { id } });
}

export async function findBake(packId: string, id: string): Promise<BakeDto | null> {
  const row = await VersionBake.findOne({ where: { id, packId } });
  return row ? toBake(row) : null;
}

/** The bakes a pack page follows: queued, baking and failed ones, newest first. */
export async function listOpenBakes(packId: string): Promise<BakeDto[]> {
  const rows = await VersionBake.findAll({ where: { packId, state: { [Op.in]: ['queued', 'baking', 'failed'] } }, order: [['createdAt', 'DESC']] });
  return Promise.all(rows.map((r) => toBake(r)));
}

/** What the worker needs to bake: the stored row (source key, profile snapshot, pack). */
export async function bakeRow(id: string): Promise<VersionBake | null> {
  return VersionBake.findByPk(id);
}

/** An attempt starts: state baking, progress from zero, attempts + 1. Not for a bake that is already done. */
export async function startAttempt(id: string): Promise<VersionBake | null> {
  const [, rows] = await VersionBake.update(
    { state: 'baking', progressDone: 0, startedAt: new Date(), attempts: VersionBake.sequelize!.literal('attempts + 1') as unknown as number },
    { where: { id, state: { [Op.ne]: 'done' }, versionId: null }, returning: true },
  );
  return rows[0] ?? null;
}

export async function setProgress(id: string, done: number): Promise<void> {
  await VersionBake.update({ progressDone: done }, { where: { id, state: 'baking' } });
}

/** A failed attempt: the reason is kept; `final` (no retry left) marks the bake failed, else it waits queued for pg-boss's retry. */
export async function recordFailure(id: string, failure: NonNullable<BakeDto['failure']>, final: boolean): Promise<BakeDto | null> {
  const [, rows] = await VersionBake.update(
    { state: final ? 'failed' : 'queued', failure, finishedAt: final ? new Date() : null },
    { where: { id, state: { [Op.ne]: 'done' } }, returning: true },
  );
  return rows[0] ? toBake(rows[0]) : null;
}

/**
 * Inserts the version and its artifact rows and marks the bake done, in one transaction, with the bake row
 * locked (SELECT … FOR UPDATE): a second run of the same bake (a retried job after a crash, or two workers
 * after an expiry) waits, sees version_id set and creates nothing. `created` says whether this call made it.
 */
export async function completeBake(id: string, v: NewVersion | null): Promise<{ created: boolean; version: VersionDto }> {
  return VersionBake.sequelize!.transaction(async (transaction) => {
    const bake = await VersionBake.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
    if (!bake) throw new Error(`bake ${id} is gone`);
    if (bake.versionId) {
      const existing = await findVersionById(bake.versionId, transaction);
      if (existing) return { created: false, version: existing };
    }
    if (!v) throw new Error(`bake ${id} has no version yet`);
    const version = await insertVersionIn(transaction, v);
    await bake.update({ state: 'done', versionId: version.id, progressDone: bake.progressTotal, finishedAt: new Date() }, { transaction });
    return { created: true, version };
  });
}

/** A failed bake goes back to the queue (retry); null when it is not failed. */
export async function requeue(packId: string, id: string): Promise<BakeDto | null> {
  const [, rows] = await VersionBake.update(
    { state: 'queued', failure: null, progressDone: 0, finishedAt: null },
    { where: { id, packId, state: 'failed' }, returning: true },
  );
  return rows[0] ? toBake(rows[0]) : null;
}

/** The pack a bake belongs to, as team events name it. */
export async function packOfBake(packId: string): Promise<{ id: string; slug: string; name: string; teamId: string } | null> {
  const p = await Pack.findByPk(packId);
  return p ? { id: p.id, slug: p.slug, name: p.name, teamId: p.teamId as string } : null;
}
