/**
 * The webhooks' team-event subscriber: for a subscribable event, one pending delivery per active webhook
 * of the team that asked for it, inserted in one statement, then this process's dispatcher is woken.
 * Registered in server/events/subscribers.ts.
 */
import { randomUUID } from 'node:crypto';
import type { AppContext } from '../context';
import { WEBHOOK_EVENTS, type WebhookEvent } from '../../shared/schemas/webhooks';
import { eventPayload } from './payload';
import { wakeDispatcher } from './dispatcher';
import { insertDeliveries, subscribedWebhooks, teamSummary } from './webhooks.repository';

export function registerWebhookSubscriber(ctx: AppContext): void {
  ctx.events.subscribe('webhooks', async (event) => {
    if (!(WEBHOOK_EVENTS as readonly string[]).includes(event.type)) return;
    const hooks = await subscribedWebhooks(event.teamId, event.type as WebhookEvent);
    if (!hooks.length) return;
    const eventId = randomUUID();
    const payload = eventPayload(eventId, event, await teamSummary(event.teamId));
    await insertDeliveries(hooks.map((h) => ({ webhookId: h.id, eventType: event.type, eventId, payload })));
    wakeDispatcher(ctx);
  });
}
