import { Router, type Response } from 'express';
import type { AppContext } from '../context';
import { validateBody, validateQuery } from '../http/validate';
import { requireTeam } from '../auth/require-role';
import { principalOf, teamAccessOf } from '../auth/principal';
import { uuidParam } from '../invitations/invitations.routes';
import { createWebhookSchema, deliveriesQuerySchema, updateWebhookSchema } from '../../shared/schemas/webhooks';
import * as webhooks from './webhooks.service';

/** Webhooks of a team; admins only (`webhooks.manage`), never service tokens. */
export function webhookRoutes(ctx: AppContext): Router {
  const router = Router();
  const base = '/teams/:teamId/webhooks';
  const guard = requireTeam('webhooks.manage');
  const team = (res: Response) => teamAccessOf(res).teamId;
  const userId = (res: Response) => {
    const p = principalOf(res);
    if (p.kind !== 'user') throw new Error('unreachable: requireTeam lets only people manage webhooks');
    return p.user.id;
  };
  const hookId = (v: unknown) => uuidParam(String(v));

  // GET /api/teams/:teamId/webhooks → { webhooks, policy } (never a secret)
  router.get(base, guard, async (_req, res) => {
    res.json({ webhooks: await webhooks.listWebhooks(team(res)), policy: webhooks.policy(ctx) });
  });

  // POST /api/teams/:teamId/webhooks { url, events, description? } → 201 { webhook, secret } — the secret is shown this once
  router.post(base, guard, validateBody(createWebhookSchema), async (req, res) => {
    const created = await webhooks.createWebhook(ctx, team(res), req.body, userId(res));
    res.set('Cache-Control', 'no-store');
    res.status(201).json(created);
  });

  // PATCH /api/teams/:teamId/webhooks/:webhookId { url?, events?, description?, active? } → { webhook }
  router.patch(`${base}/:webhookId`, guard, validateBody(updateWebhookSchema), async (req, res) => {
    res.json({ webhook: await webhooks.updateWebhook(ctx, team(res), hookId(req.params.webhookId), req.body) });
  });

  // DELETE /api/teams/:teamId/webhooks/:webhookId → 204; its deliveries go with it
  router.delete(`${base}/:webhookId`, guard, async (req, res) => {
    await webhooks.deleteWebhook(team(res), hookId(req.params.webhookId));
    res.status(204).end();
  });

  // POST /api/teams/:teamId/webhooks/:webhookId/rotate-secret → { webhook, secret } — the new secret is shown this once
  router.post(`${base}/:webhookId/rotate-secret`, guard, async (req, res) => {
    const rotated = await webhooks.rotateSecret(team(res), hookId(req.params.webhookId));
    res.set('Cache-Control', 'no-store');
    res.json(rotated);
  });

  // POST /api/teams/:teamId/webhooks/:webhookId/ping → 202 { delivery } (a `ping` event, sent now)
  router.post(`${base}/:webhookId/ping`, guard, async (req, res) => {
    res.status(202).json({ delivery: await webhooks.sendPing(ctx, team(res), hookId(req.params.webhookId), userId(res)) });
  });

  // GET /api/teams/:teamId/webhooks/:webhookId/deliveries?page=1&perPage=20 → { deliveries (newest first), page, perPage, total }
  router.get(`${base}/:webhookId/deliveries`, guard, validateQuery(deliveriesQuerySchema), async (req, res) => {
    const q = res.locals.query as { page: number; perPage: number };
    res.json(await webhooks.listDeliveries(ctx, team(res), hookId(req.params.webhookId), q.page, q.perPage));
  });

  // POST /api/teams/:teamId/webhooks/:webhookId/deliveries/:deliveryId/redeliver → 202 { delivery } (same event and body, sent now)
  router.post(`${base}/:webhookId/deliveries/:deliveryId/redeliver`, guard, async (req, res) => {
    res.status(202).json({ delivery: await webhooks.redeliver(ctx, team(res), hookId(req.params.webhookId), hookId(req.params.deliveryId)) });
  });

  return router;
}
