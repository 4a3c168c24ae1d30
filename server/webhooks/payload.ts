/**
 * The JSON body of a delivery, made once per event and stored as the exact bytes that are signed:
 *   { id, type, team: { id, slug, name }, pack: { id, slug, name } | null, subject: { kind, id?, label }, data, at }
 * `id` is the event's id (the same for every webhook that receives it, and on a redelivery), so a
 * receiver can ignore an event it has already handled.
 */
import type { TeamEvent } from '../events/team-events';

export interface WebhookPayload {
  id: string;
  type: string;
  team: { id: string; slug: string; name: string };
  pack: { id: string; slug: string; name: string } | null;
  subject: { kind: string; id?: string; label: string };
  data: Record<string, unknown>;
  at: string;
}

export function eventPayload(eventId: string, event: TeamEvent, team: WebhookPayload['team']): string {
  const body: WebhookPayload = {
    id: eventId,
    type: event.type,
    team,
    pack: event.pack ?? null,
    subject: event.subject,
    data: event.data,
    at: event.at.toISOString(),
  };
  return JSON.stringify(body);
}
