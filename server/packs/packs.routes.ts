import { Router } from 'express';
import type { AppContext } from '../context';
import { requireTeam, requireUser } from '../auth/require-role';
import { principalOf, teamAccessOf } from '../auth/principal';
import { uuidParam } from '../invitations/invitations.routes';
import { validateBody } from '../http/validate';
import { curveCreateSchema, curveReorderSchema, curveReplaceSchema, curveTransferSchema, packCreateSchema, packUpdateSchema } from '../../shared/schemas/packs';
import * as packs from './packs.service';
import type { TeamEvent, TeamEventType } from '../events/team-events';
import type { CurveDto, PackDto } from '../../shared/schemas/packs';

/**
 * Packs of a team and the curves in them. Every member (and the team's service tokens, limited to their
 * packs) reads; admins, leads and animators (curves.edit) write.
 */
export function packRoutes(ctx: AppContext): Router {
  const router = Router();
  // a team event after the change commits (server/events/team-events.ts); actor = the signed-in person
  const publish = (res: Parameters<typeof teamAccessOf>[0], type: TeamEventType, pack: PackDto, subject: TeamEvent['subject'], data: Record<string, unknown> = {}) => {
    const p = principalOf(res);
    return ctx.events.publish({ type, teamId: team(res), actorId: p.kind === 'user' ? p.user.id : null, pack: { id: pack.id, slug: pack.slug, name: pack.name }, subject, data });
  };
  const packSubject = (pack: PackDto): TeamEvent['subject'] => ({ kind: 'pack', id: pack.id, label: pack.slug });
  const curveSubject = (c: CurveDto): TeamEvent['subject'] => ({ kind: 'curve', id: c.id, label: c.name });
  const base = '/teams/:teamId/packs';
  const team = (res: Parameters<typeof teamAccessOf>[0]) => teamAccessOf(res).teamId;
  const slug = (v: unknown) => String(v);
  const curveId = (v: unknown) => uuidParam(String(v));

  // GET …/packs → { packs: PackDto[] } (archived last)
  router.get(base, requireTeam('team.read'), async (_req, res) => {
    res.json({ packs: await packs.listPacks(principalOf(res), team(res)) });
  });

  // POST …/packs { name, slug?, description?, frameRate?, tags? } → 201 { pack }; 409 slug_taken
  router.post(base, requireUser(), requireTeam('curves.edit'), validateBody(packCreateSchema), async (req, res) => {
    const pack = await packs.createPack(team(res), req.body);
    await publish(res, 'pack.created', pack, packSubject(pack));
    res.status(201).json({ pack });
  });

  // GET …/packs/:pack → { pack, curves }
  router.get(`${base}/:pack`, requireTeam('team.read'), async (req, res) => {
    res.json(await packs.listCurves(principalOf(res), team(res), slug(req.params.pack)));
  });

  // PATCH …/packs/:pack { name?, description?, frameRate?, tags?, archived? } → { pack } (rename, archive, restore)
  router.patch(`${base}/:pack`, requireUser(), requireTeam('curves.edit'), validateBody(packUpdateSchema), async (req, res) => {
    const before = await packs.getPack(principalOf(res), team(res), slug(req.params.pack));
    const pack = await packs.updatePack(principalOf(res), team(res), slug(req.params.pack), req.body);
    const type = before.archived !== pack.archived ? (pack.archived ? 'pack.archived' : 'pack.restored') : 'pack.updated';
    await publish(res, type, pack, packSubject(pack), { changed: Object.keys(req.body), ...(before.name !== pack.name ? { renamedFrom: before.name } : {}) });
    res.json({ pack });
  });

  // GET …/packs/:pack/curves → { curves } in the pack's order
  router.get(`${base}/:pack/curves`, requireTeam('team.read'), async (req, res) => {
    res.json({ curves: (await packs.listCurves(principalOf(res), team(res), slug(req.params.pack))).curves });
  });

  // POST …/packs/:pack/curves { document } → 201 { curve }; 400 names document.<path>; 409 name_taken
  router.post(`${base}/:pack/curves`, requireUser(), requireTeam('curves.edit'), validateBody(curveCreateSchema), async (req, res) => {
    const curve = await packs.createCurve(principalOf(res), team(res), slug(req.params.pack), req.body.document);
    await publish(res, 'curve.created', await packs.getPack(principalOf(res), team(res), slug(req.params.pack)), curveSubject(curve), { revision: curve.revision });
    res.status(201).json({ curve });
  });

  // POST …/packs/:pack/reorder { curveIds } → { curves } in the new order
  router.post(`${base}/:pack/reorder`, requireUser(), requireTeam('curves.edit'), validateBody(curveReorderSchema), async (req, res) => {
    const curves = await packs.reorderCurves(principalOf(res), team(res), slug(req.params.pack), req.body.curveIds);
    const pack = await packs.getPack(principalOf(res), team(res), slug(req.params.pack));
    await publish(res, 'curves.reordered', pack, packSubject(pack), { order: curves.map((c) => c.name) });
    res.json({ curves });
  });

  // GET …/packs/:pack/curves/:curveId → { curve }
  router.get(`${base}/:pack/curves/:curveId`, requireTeam('team.read'), async (req, res) => {
    res.json({ curve: await packs.getCurve(principalOf(res), team(res), slug(req.params.pack), curveId(req.params.curveId)) });
  });

  // PUT …/packs/:pack/curves/:curveId { document, revision } → { curve }; 409 revision_conflict
  router.put(`${base}/:pack/curves/:curveId`, requireUser(), requireTeam('curves.edit'), validateBody(curveReplaceSchema), async (req, res) => {
    const curve = await packs.replaceCurve(principalOf(res), team(res), slug(req.params.pack), curveId(req.params.curveId), req.body.document, req.body.revision);
    await publish(res, 'curve.saved', await packs.getPack(principalOf(res), team(res), slug(req.params.pack)), curveSubject(curve), { revision: curve.revision });
    res.json({ curve });
  });

  // DELETE …/packs/:pack/curves/:curveId → 204
  router.delete(`${base}/:pack/curves/:curveId`, requireUser(), requireTeam('curves.edit'), async (req, res) => {
    const gone = await packs.getCurve(principalOf(res), team(res), slug(req.params.pack), curveId(req.params.curveId));
    await packs.removeCurve(principalOf(res), team(res), slug(req.params.pack), curveId(req.params.curveId));
    await publish(res, 'curve.deleted', await packs.getPack(principalOf(res), team(res), slug(req.params.pack)), curveSubject(gone));
    res.status(204).end();
  });

  // POST …/packs/:pack/curves/:curveId/move { toPack } → { curve } now in the other pack (at its end)
  router.post(`${base}/:pack/curves/:curveId/move`, requireUser(), requireTeam('curves.edit'), validateBody(curveTransferSchema), async (req, res) => {
    const curve = await packs.moveCurve(principalOf(res), team(res), slug(req.params.pack), curveId(req.params.curveId), req.body.toPack);
    await publish(res, 'curve.moved', await packs.getPack(principalOf(res), team(res), slug(req.params.pack)), curveSubject(curve), { toPack: req.body.toPack });
    res.json({ curve });
  });

  // POST …/packs/:pack/curves/:curveId/copy { toPack, name? } → 201 { curve } (a new curve, revision 1)
  router.post(`${base}/:pack/curves/:curveId/copy`, requireUser(), requireTeam('curves.edit'), validateBody(curveTransferSchema), async (req, res) => {
    const from = await packs.getCurve(principalOf(res), team(res), slug(req.params.pack), curveId(req.params.curveId));
    const curve = await packs.copyCurve(principalOf(res), team(res), slug(req.params.pack), curveId(req.params.curveId), req.body.toPack, req.body.name);
    await publish(res, 'curve.copied', await packs.getPack(principalOf(res), team(res), slug(req.params.pack)), curveSubject(curve), { from: from.name, fromId: from.id, toPack: req.body.toPack, name: curve.name });
    res.status(201).json({ curve });
  });

  return router;
}
