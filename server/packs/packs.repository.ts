/** Packs and curves in PostgreSQL. The only module that touches the Pack and Curve models. */
import { Op, type Transaction } from 'sequelize';
import { Curve, Pack } from '../models';
import type { CurveDocument } from '../../shared/curve';
import type { CurveDto, PackDto } from '../../shared/schemas/packs';

function toPack(row: Pack, curveCount: number): PackDto {
  return {
    id: row.id, teamId: row.teamId as string, name: row.name, slug: row.slug, description: row.description,
    frameRate: row.frameRate, tags: row.tags, archived: row.archived, curveCount, updatedAt: row.updatedAt.toISOString(),
  };
}

function toCurve(row: Curve): CurveDto {
  return {
    id: row.id, packId: row.packId as string, name: row.name, document: row.document,
    position: row.position, revision: row.revision, updatedAt: row.updatedAt.toISOString(),
  };
}

async function countsOf(packIds: string[], transaction?: Transaction): Promise<Map<string, number>> {
  if (packIds.length === 0) return new Map();
  const rows = (await Curve.count({ where: { packId: packIds }, group: ['packId'], transaction })) as unknown as { packId: string; count: number | string }[];
  return new Map(rows.map((r) => [r.packId, Number(r.count)]));
}

export async function listPacks(teamId: string, slugs: string[] | null): Promise<PackDto[]> {
  const where = slugs === null ? { teamId } : { teamId, slug: { [Op.in]: slugs } };
  const rows = await Pack.findAll({ where, order: [['archived', 'ASC'], ['name', 'ASC']] });
  const counts = await countsOf(rows.map((r) => r.id));
  return rows.map((r) => toPack(r, counts.get(r.id) ?? 0));
}

export async function findPack(teamId: string, slug: string, transaction?: Transaction): Promise<PackDto | null> {
  const row = await Pack.findOne({ where: { teamId, slug }, transaction });
  if (!row) return null;
  return toPack(row, (await countsOf([row.id], transaction)).get(row.id) ?? 0);
}

export async function insertPack(teamId: string, input: { name: string; slug: string; description: string; frameRate: number; tags: string[] }, transaction?: Transaction): Promise<PackDto> {
  return toPack(await Pack.create({ teamId, ...input }, { transaction }), 0);
}

export async function updatePack(teamId: string, slug: string, patch: Partial<Pick<PackDto, 'name' | 'description' | 'frameRate' | 'tags' | 'archived'>>): Promise<PackDto | null> {
  const [count] = await Pack.update(patch, { where: { teamId, slug } });
  return count === 1 ? findPack(teamId, slug) : null;
}

export async function listCurves(packId: string, transaction?: Transaction): Promise<CurveDto[]> {
  const rows = await Curve.findAll({ where: { packId }, order: [['position', 'ASC'], ['name', 'ASC']], transaction });
  return rows.map(toCurve);
}

export async function findCurve(packId: string, id: string, transaction?: Transaction): Promise<CurveDto | null> {
  const row = await Curve.findOne({ where: { packId, id }, transaction });
  return row ? toCurve(row) : null;
}

/** Appends the curve at the end of the pack. */
export async function insertCurve(packId: string, doc: CurveDocument, transaction?: Transaction): Promise<CurveDto> {
  const last = (await Curve.max<number, Curve>('position', { where: { packId }, transaction })) ?? -1;
  return toCurve(await Curve.create({ packId, name: doc.name, document: doc, position: last + 1 }, { transaction }));
}

/** Replace when the revision is still `expected` (optimistic concurrency); null when someone saved in between. */
export async function updateCurve(packId: string, id: string, doc: CurveDocument, expected: number): Promise<CurveDto | null> {
  const [count, rows] = await Curve.update(
    { name: doc.name, document: doc, revision: expected + 1 },
    { where: { packId, id, revision: expected }, returning: true },
  );
  return count === 1 && rows[0] ? toCurve(rows[0]) : null;
}

export async function deleteCurve(packId: string, id: string): Promise<boolean> {
  return (await Curve.destroy({ where: { packId, id } })) === 1;
}

/** Positions 0…n−1 in the order given (ids already checked to be exactly the pack's curves). */
export async function setOrder(packId: string, ids: string[], transaction: Transaction): Promise<void> {
  for (const [position, id] of ids.entries()) await Curve.update({ position }, { where: { packId, id }, transaction });
}

/** Moves a curve to the end of another pack (its revision counts the change). */
export async function moveCurve(fromPackId: string, id: string, toPackId: string, transaction: Transaction): Promise<CurveDto | null> {
  const last = (await Curve.max<number, Curve>('position', { where: { packId: toPackId }, transaction })) ?? -1;
  const row = await Curve.findOne({ where: { packId: fromPackId, id }, transaction });
  if (!row) return null;
  row.packId = toPackId;
  row.position = last + 1;
  row.revision = row.revision + 1;
  await row.save({ transaction });
  return toCurve(row);
}

/** Runs `fn` in one transaction (services span rows through this, never through a model). */
export function inTransaction<T>(fn: (transaction: Transaction) => Promise<T>): Promise<T> {
  return Pack.sequelize!.transaction(fn);
}
