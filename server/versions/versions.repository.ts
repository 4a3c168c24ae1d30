/** Pack versions and their artifacts in PostgreSQL. The only module that touches PackVersion and VersionArtifact. */
import { QueryTypes, type Transaction } from 'sequelize';
import { PackVersion, User, VersionArtifact, VersionReview } from '../models';
import type { ArtifactDto, ArtifactFormat, BakeSummary, ReviewDecision, ReviewDto, VersionDto } from '../../shared/schemas/versions';

function toArtifact(a: VersionArtifact): ArtifactDto {
  return { id: a.id, profileName: a.profileName, format: a.format as ArtifactFormat, fileName: a.fileName, mediaType: a.mediaType, key: a.key, sha256: a.sha256, size: a.size };
}

async function person(id: string | null, transaction?: Transaction): Promise<{ id: string; name: string } | null> {
  const u = id ? await User.findByPk(id, { transaction }) : null;
  return u ? { id: u.id, name: u.name } : null;
}

async function reviewsOf(versionId: string, transaction?: Transaction): Promise<ReviewDto[]> {
  const rows = await VersionReview.findAll({ where: { versionId }, order: [['createdAt', 'ASC']], transaction });
  return Promise.all(rows.map(async (r) => ({ id: r.id, decision: r.decision, comment: r.comment, reviewer: await person(r.reviewerId, transaction), createdAt: r.createdAt.toISOString() })));
}

async function toVersion(v: PackVersion, artifacts: VersionArtifact[], transaction?: Transaction): Promise<VersionDto> {
  const user = await person(v.proposedBy, transaction);
  return {
    id: v.id, packId: v.packId as string, number: v.number, changelog: v.changelog, state: v.state,
    proposedBy: user, curveCount: v.curveCount,
    source: { key: v.sourceKey, sha256: v.sourceSha256, size: v.sourceSize }, bakeSummary: v.bakeSummary,
    artifacts: artifacts.sort((a, b) => a.position - b.position).map(toArtifact), reviews: await reviewsOf(v.id, transaction), createdAt: v.createdAt.toISOString(),
  };
}

export async function listVersions(packId: string): Promise<VersionDto[]> {
  const rows = await PackVersion.findAll({ where: { packId }, order: [['number', 'DESC']] });
  const arts = rows.length ? await VersionArtifact.findAll({ where: { versionId: rows.map((r) => r.id) } }) : [];
  return Promise.all(rows.map((r) => toVersion(r, arts.filter((a) => a.versionId === r.id))));
}

export async function findVersion(packId: string, number: number): Promise<VersionDto | null> {
  const row = await PackVersion.findOne({ where: { packId, number } });
  if (!row) return null;
  return toVersion(row, await VersionArtifact.findAll({ where: { versionId: row.id } }));
}

export interface NewVersion {
  packId: string;
  changelog: string;
  proposedBy: string | null;
  curveCount: number;
  source: { key: string; sha256: string; size: number };
  bakeSummary: BakeSummary[];
  artifacts: Omit<ArtifactDto, 'id'>[];
}

/**
 * Inserts the version and all its artifact rows in one transaction, numbered one past the pack's
 * latest. The pack row is locked (SELECT … FOR UPDATE) so two proposals of one pack get v(n+1) and v(n+2).
 */
export async function insertVersion(v: NewVersion): Promise<VersionDto> {
  return PackVersion.sequelize!.transaction((transaction) => insertVersionIn(transaction, v));
}

/** insertVersion inside the caller's transaction (the bake worker also marks its bake done in it). */
export async function insertVersionIn(transaction: Transaction, v: NewVersion): Promise<VersionDto> {
  await PackVersion.sequelize!.query('SELECT id FROM packs WHERE id = :id FOR UPDATE', { replacements: { id: v.packId }, type: QueryTypes.SELECT, transaction });
  const last = (await PackVersion.max<number, PackVersion>('number', { where: { packId: v.packId }, transaction })) ?? 0;
  const row = await PackVersion.create({
    packId: v.packId, number: last + 1, changelog: v.changelog, proposedBy: v.proposedBy, curveCount: v.curveCount,
    sourceKey: v.source.key, sourceSha256: v.source.sha256, sourceSize: v.source.size, bakeSummary: v.bakeSummary,
  }, { transaction });
  const arts = await VersionArtifact.bulkCreate(v.artifacts.map((a, position) => ({ ...a, versionId: row.id, position })), { transaction, returning: true });
  return toVersion(row, arts, transaction);
}

/** A version by its id (for a finished bake). */
export async function findVersionById(id: string, transaction?: Transaction): Promise<VersionDto | null> {
  const row = await PackVersion.findByPk(id, { transaction });
  return row ? toVersion(row, await VersionArtifact.findAll({ where: { versionId: row.id }, transaction }), transaction) : null;
}

const STATE_AFTER: Record<ReviewDecision, string> = { approve: 'approved', 'request-changes': 'changes-requested' };

/** Records a review and moves the version's state, in one transaction. */
export async function insertReview(packId: string, number: number, review: { reviewerId: string; decision: ReviewDecision; comment: string }): Promise<VersionDto | null> {
  return PackVersion.sequelize!.transaction(async (transaction) => {
    const v = await PackVersion.findOne({ where: { packId, number }, transaction, lock: transaction.LOCK.UPDATE });
    if (!v) return null;
    await VersionReview.create({ versionId: v.id, ...review }, { transaction });
    v.state = STATE_AFTER[review.decision];
    await v.save({ transaction });
    return toVersion(v, await VersionArtifact.findAll({ where: { versionId: v.id }, transaction }), transaction);
  });
}

/** The e-mail address of a person (for review notifications). */
export async function emailOf(userId: string): Promise<string | null> {
  return (await User.findByPk(userId))?.email ?? null;
}
