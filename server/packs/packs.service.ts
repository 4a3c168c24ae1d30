/**
 * Packs and their curves: the rules that need the database. Bodies are checked at the edge with the
 * shared schemas (shared/schemas/packs.ts); a curve document with parseCurveDocument (shared/curve), so
 * every issue names its path (`document.keys[2].time`). Service tokens limited to some packs never see
 * the others (404, like a pack that does not exist).
 */
import { UniqueConstraintError } from 'sequelize';
import { parseCurveDocument, type CurveDocument } from '../../shared/curve';
import { slugify, type CurveDto, type PackDto, type PackCreateInput } from '../../shared/schemas/packs';
import { HttpError, badRequest, conflict, notFound } from '../http/errors';
import { tokenAllowsPack, type Principal } from '../auth/principal';
import * as repo from './packs.repository';

const noPack = (slug: string) => notFound(`No pack "${slug}" in this team.`);
const noCurve = () => notFound('No such curve in this pack.');

export function validDocument(input: unknown, field = 'document'): CurveDocument {
  const parsed = parseCurveDocument(input);
  if (!parsed.ok) {
    // issue messages start with their path ("keys[2].time: …", or "document: …" for the whole)
    const named = (i: { path: string; message: string }) => (i.path ? `${field}.${i.message}` : i.message.replace(/^document:/, `${field}:`));
    const fields = Object.fromEntries(parsed.issues.map((i) => [i.path ? `${field}.${i.path}` : field, named(i)]));
    throw badRequest(parsed.issues[0] ? named(parsed.issues[0]) : `${field}: not a curve document`, fields);
  }
  return parsed.doc;
}

const curveNameTaken = (name: string, pack: string) =>
  new HttpError(409, 'name_taken', `A curve named "${name}" already exists in pack "${pack}".`, {
    'document.name': `document.name: "${name}" is already used in this pack`,
  });

/** The pack, if it exists in the team and the caller (a token limited to some packs) may see it. */
export async function getPack(p: Principal, teamId: string, slug: string): Promise<PackDto> {
  if (!tokenAllowsPack(p, slug)) throw noPack(slug);
  const pack = await repo.findPack(teamId, slug);
  if (!pack) throw noPack(slug);
  return pack;
}

export async function listPacks(p: Principal, teamId: string): Promise<PackDto[]> {
  return repo.listPacks(teamId, p.kind === 'token' ? p.token.packSlugs : null);
}

export async function createPack(teamId: string, input: Required<Omit<PackCreateInput, 'slug'>> & { slug?: string }): Promise<PackDto> {
  const slug = input.slug ?? slugify(input.name);
  try {
    return await repo.insertPack(teamId, { name: input.name, slug, description: input.description, frameRate: input.frameRate, tags: input.tags });
  } catch (err) {
    if (err instanceof UniqueConstraintError) {
      throw new HttpError(409, 'slug_taken', `A pack with the slug "${slug}" already exists in this team.`, { slug: `slug: "${slug}" is already used in this team` });
    }
    throw err;
  }
}

export async function updatePack(p: Principal, teamId: string, slug: string, patch: Parameters<typeof repo.updatePack>[2]): Promise<PackDto> {
  await getPack(p, teamId, slug);
  const saved = await repo.updatePack(teamId, slug, patch);
  if (!saved) throw noPack(slug);
  return saved;
}

export async function listCurves(p: Principal, teamId: string, slug: string): Promise<{ pack: PackDto; curves: CurveDto[] }> {
  const pack = await getPack(p, teamId, slug);
  return { pack, curves: await repo.listCurves(pack.id) };
}

export async function getCurve(p: Principal, teamId: string, slug: string, id: string): Promise<CurveDto> {
  const pack = await getPack(p, teamId, slug);
  const c = await repo.findCurve(pack.id, id);
  if (!c) throw noCurve();
  return c;
}

function refuseArchived(pack: PackDto): void {
  if (pack.archived) throw conflict(`Pack "${pack.slug}" is archived; restore it before changing its curves.`, 'pack_archived');
}

export async function createCurve(p: Principal, teamId: string, slug: string, input: unknown): Promise<CurveDto> {
  const doc = validDocument(input);
  const pack = await getPack(p, teamId, slug);
  refuseArchived(pack);
  try {
    return await repo.inTransaction((transaction) => repo.insertCurve(pack.id, doc, transaction));
  } catch (err) {
    if (err instanceof UniqueConstraintError) throw curveNameTaken(doc.name, slug);
    throw err;
  }
}

export async function replaceCurve(p: Principal, teamId: string, slug: string, id: string, input: unknown, revision: number): Promise<CurveDto> {
  const doc = validDocument(input);
  const pack = await getPack(p, teamId, slug);
  refuseArchived(pack);
  if (!(await repo.findCurve(pack.id, id))) throw noCurve();
  try {
    const saved = await repo.updateCurve(pack.id, id, doc, revision);
    if (!saved) {
      const current = await repo.findCurve(pack.id, id);
      throw new HttpError(409, 'revision_conflict', `Someone else saved this curve since you opened it (you had revision ${revision}, it is now ${current?.revision ?? '?'}). Reload to see their change.`, {
        revision: `revision: ${revision} is out of date; the stored revision is ${current?.revision ?? '?'}`,
      });
    }
    return saved;
  } catch (err) {
    if (err instanceof UniqueConstraintError) throw curveNameTaken(doc.name, slug);
    throw err;
  }
}

export async function removeCurve(p: Principal, teamId: string, slug: string, id: string): Promise<void> {
  const pack = await getPack(p, teamId, slug);
  refuseArchived(pack);
  if (!(await repo.deleteCurve(pack.id, id))) throw noCurve();
}

/** New order of the whole pack: `ids` must be exactly the pack's curves, each once. */
export async function reorderCurves(p: Principal, teamId: string, slug: string, ids: string[]): Promise<CurveDto[]> {
  const pack = await getPack(p, teamId, slug);
  refuseArchived(pack);
  return repo.inTransaction(async (transaction) => {
    const current = await repo.listCurves(pack.id, transaction);
    const have = new Set(current.map((c) => c.id));
    const given = new Set(ids);
    if (given.size !== ids.length || ids.length !== have.size || ids.some((id) => !have.has(id))) {
      throw badRequest('curveIds: must list every curve of the pack exactly once', {
        curveIds: `curveIds: must list every curve of the pack exactly once (${have.size} curves, ${ids.length} given)`,
      });
    }
    await repo.setOrder(pack.id, ids, transaction);
    return repo.listCurves(pack.id, transaction);
  });
}

async function targetPack(p: Principal, teamId: string, from: PackDto, toSlug: string): Promise<PackDto> {
  if (toSlug === from.slug) throw badRequest('toPack: is the pack the curve is already in', { toPack: 'toPack: choose another pack' });
  const to = await repo.findPack(teamId, toSlug);
  if (!to || !tokenAllowsPack(p, toSlug)) throw badRequest(`toPack: no pack "${toSlug}" in this team`, { toPack: `toPack: no pack "${toSlug}" in this team` });
  if (to.archived) throw badRequest(`toPack: pack "${toSlug}" is archived`, { toPack: `toPack: pack "${toSlug}" is archived` });
  return to;
}

export async function moveCurve(p: Principal, teamId: string, slug: string, id: string, toSlug: string): Promise<CurveDto> {
  const from = await getPack(p, teamId, slug);
  refuseArchived(from);
  const to = await targetPack(p, teamId, from, toSlug);
  const curve = await repo.findCurve(from.id, id);
  if (!curve) throw noCurve();
  try {
    return await repo.inTransaction(async (transaction) => (await repo.moveCurve(from.id, id, to.id, transaction))!);
  } catch (err) {
    if (err instanceof UniqueConstraintError) throw curveNameTaken(curve.name, toSlug);
    throw err;
  }
}

/** Copies a curve (to another pack, or to the same one under a new name). */
export async function copyCurve(p: Principal, teamId: string, slug: string, id: string, toSlug: string, name?: string): Promise<CurveDto> {
  const from = await getPack(p, teamId, slug);
  const curve = await repo.findCurve(from.id, id);
  if (!curve) throw noCurve();
  const to = toSlug === slug ? from : await targetPack(p, teamId, from, toSlug);
  refuseArchived(to);
  const doc = { ...curve.document, name: name ?? curve.name };
  try {
    return await repo.inTransaction((transaction) => repo.insertCurve(to.id, doc, transaction));
  } catch (err) {
    if (err instanceof UniqueConstraintError) throw curveNameTaken(doc.name, to.slug);
    throw err;
  }
}
