/**
 * Webhooks of a team: register (the secret is shown once), change, turn off, delete, rotate the secret,
 * send a test ping, list deliveries and redeliver one. Target URLs follow ./target-policy.ts.
 */
import { randomBytes, randomUUID } from 'node:crypto';
import type { AppContext } from '../context';
import { badRequest, conflict, notFound } from '../http/errors';
import { PING_EVENT, type CreateWebhookInput, type DeliveriesPageDto, type DeliveryDto, type WebhookDto, type WebhookEvent } from '../../shared/schemas/webhooks';
import { maxAttempts } from './backoff';
import { wakeDispatcher } from './dispatcher';
import { targetProblem } from './target-policy';
import * as repo from './webhooks.repository';

/** 32 random bytes (256 bits, the HMAC-SHA256 output size; RFC 2104 §3 recommends a key at least that long). */
export function newWebhookSecret(): string {
  return `whsec_${randomBytes(32).toString('base64url')}`;
}

function checkTarget(ctx: AppContext, url: string): void {
  const problem = targetProblem(url, ctx.config.webhooks.allowPrivateTargets);
  if (problem) throw badRequest(`url: ${problem}`, { url: problem });
}

const noWebhook = () => notFound('No webhook with that id in this team.');

export async function createWebhook(ctx: AppContext, teamId: string, input: { url: string; events: WebhookEvent[]; description: string }, createdBy: string): Promise<{ webhook: WebhookDto; secret: string }> {
  checkTarget(ctx, input.url);
  const secret = newWebhookSecret();
  const webhook = await repo.insertWebhook({ teamId, url: input.url, description: input.description, events: input.events, secret, createdBy });
  return { webhook, secret };
}

export const listWebhooks = repo.listWebhooks;

export async function updateWebhook(ctx: AppContext, teamId: string, id: string, patch: Partial<CreateWebhookInput & { active: boolean }>): Promise<WebhookDto> {
  if (patch.url !== undefined) checkTarget(ctx, patch.url);
  const w = await repo.updateWebhook(teamId, id, {
    ...(patch.url !== undefined ? { url: patch.url } : {}),
    ...(patch.description !== undefined ? { description: patch.description } : {}),
    ...(patch.events !== undefined ? { events: patch.events } : {}),
    ...(patch.active !== undefined ? { active: patch.active } : {}),
  });
  if (!w) throw noWebhook();
  return w;
}

export async function deleteWebhook(teamId: string, id: string): Promise<void> {
  if (!(await repo.deleteWebhook(teamId, id))) throw noWebhook();
}

/** A new secret at once; deliveries from now on are signed with it (the old one stops verifying). */
export async function rotateSecret(teamId: string, id: string): Promise<{ webhook: WebhookDto; secret: string }> {
  const secret = newWebhookSecret();
  const webhook = await repo.updateWebhook(teamId, id, { secret, secretRotatedAt: new Date() });
  if (!webhook) throw noWebhook();
  return { webhook, secret };
}

async function activeWebhook(teamId: string, id: string): Promise<WebhookDto> {
  const w = await repo.findWebhook(teamId, id);
  if (!w) throw noWebhook();
  if (!w.active) throw conflict('This webhook is turned off; turn it on to send to it.', 'webhook_inactive');
  return w;
}

/** A `ping` delivery to this webhook only, whatever events it asked for. */
export async function sendPing(ctx: AppContext, teamId: string, id: string, actorId: string): Promise<DeliveryDto> {
  const w = await activeWebhook(teamId, id);
  const eventId = randomUUID();
  const team = await repo.teamSummary(teamId);
  const payload = JSON.stringify({
    id: eventId, type: PING_EVENT, team, pack: null, subject: { kind: 'webhook', id: w.id, label: w.description || w.url },
    data: { webhookId: w.id, events: w.events, by: actorId }, at: new Date().toISOString(),
  });
  const [row] = await repo.insertDeliveries([{ webhookId: w.id, eventType: PING_EVENT, eventId, payload }]);
  wakeDispatcher(ctx);
  return repo.toDeliveryDto(row!, maxAttempts(ctx.config.webhooks.retryScheduleSeconds));
}

export async function listDeliveries(ctx: AppContext, teamId: string, id: string, page: number, perPage: number): Promise<DeliveriesPageDto> {
  if (!(await repo.findWebhook(teamId, id))) throw noWebhook();
  const { rows, total } = await repo.listDeliveries(id, page, perPage);
  const max = maxAttempts(ctx.config.webhooks.retryScheduleSeconds);
  return { deliveries: rows.map((r) => repo.toDeliveryDto(r, max)), page, perPage, total };
}

/** A new delivery of the same event and the same body, due now (the original keeps its record). */
export async function redeliver(ctx: AppContext, teamId: string, id: string, deliveryId: string): Promise<DeliveryDto> {
  await activeWebhook(teamId, id);
  const original = await repo.findDelivery(id, deliveryId);
  if (!original) throw notFound('No delivery with that id for this webhook.');
  const [row] = await repo.insertDeliveries([{ webhookId: id, eventType: original.eventType, eventId: original.eventId, payload: original.payload, redeliveryOf: original.id }]);
  wakeDispatcher(ctx);
  return repo.toDeliveryDto(row!, maxAttempts(ctx.config.webhooks.retryScheduleSeconds));
}

export function policy(ctx: AppContext) {
  const c = ctx.config.webhooks;
  return { httpsOnly: !c.allowPrivateTargets, privateAddressesAllowed: c.allowPrivateTargets, retryScheduleSeconds: c.retryScheduleSeconds, timeoutMs: c.timeoutMs };
}
