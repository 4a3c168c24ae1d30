/** Webhooks and their deliveries in PostgreSQL. The only module that touches the Webhook and WebhookDelivery models. */
import { QueryTypes, type Sequelize } from 'sequelize';
import { Team, Webhook, WebhookDelivery } from '../models';
import type { DeliveryAttempt } from '../models/webhook-delivery';
import type { DeliveryDto, WebhookDto, WebhookEvent } from '../../shared/schemas/webhooks';

function toDto(row: Webhook, last: WebhookDelivery | null): WebhookDto {
  return {
    id: row.id,
    url: row.url,
    description: row.description,
    events: row.events as WebhookEvent[],
    active: row.active,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
    secretRotatedAt: row.secretRotatedAt ? row.secretRotatedAt.toISOString() : null,
    lastDelivery: last ? { state: last.state, attempts: last.attempts, statusCode: last.lastStatusCode, at: (last.deliveredAt ?? last.updatedAt).toISOString() } : null,
  };
}

export function toDeliveryDto(row: WebhookDelivery, maxAttempts: number): DeliveryDto {
  return {
    id: row.id,
    eventType: row.eventType,
    eventId: row.eventId,
    state: row.state,
    attempts: row.attempts,
    maxAttempts,
    nextAttemptAt: row.state === 'pending' && row.nextAttemptAt ? row.nextAttemptAt.toISOString() : null,
    lastStatusCode: row.lastStatusCode,
    lastResponseMs: row.lastResponseMs,
    lastError: row.lastError,
    log: row.attemptLog ?? [],
    redeliveryOf: row.redeliveryOf,
    deliveredAt: row.deliveredAt ? row.deliveredAt.toISOString() : null,
    createdAt: row.createdAt.toISOString(),
  };
}

async function lastDeliveryOf(webhookId: string): Promise<WebhookDelivery | null> {
  return WebhookDelivery.findOne({ where: { webhookId }, order: [['createdAt', 'DESC']] });
}

export async function insertWebhook(w: { teamId: string; url: string; description: string; events: string[]; secret: string; createdBy: string }): Promise<WebhookDto> {
  return toDto(await Webhook.create(w), null);
}

export async function listWebhooks(teamId: string): Promise<WebhookDto[]> {
  const rows = await Webhook.findAll({ where: { teamId }, order: [['createdAt', 'DESC']] });
  return Promise.all(rows.map(async (r) => toDto(r, await lastDeliveryOf(r.id))));
}

export async function findWebhook(teamId: string, id: string): Promise<WebhookDto | null> {
  const row = await Webhook.findOne({ where: { id, teamId } });
  return row ? toDto(row, await lastDeliveryOf(row.id)) : null;
}

export async function updateWebhook(teamId: string, id: string, patch: Partial<Pick<Webhook, 'url' | 'description' | 'events' | 'active' | 'secret' | 'secretRotatedAt'>>): Promise<WebhookDto | null> {
  const row = await Webhook.findOne({ where: { id, teamId } });
  if (!row) return null;
  await row.update(patch);
  return toDto(row, await lastDeliveryOf(row.id));
}

export async function deleteWebhook(teamId: string, id: string): Promise<boolean> {
  return (await Webhook.destroy({ where: { id, teamId } })) > 0;
}

/** Active webhooks of the team subscribed to `eventType`. */
export async function subscribedWebhooks(teamId: string, eventType: string): Promise<{ id: string }[]> {
  const rows = await Webhook.findAll({ where: { teamId, active: true }, attributes: ['id', 'events'] });
  return rows.filter((r) => r.events.includes(eventType)).map((r) => ({ id: r.id }));
}

export async function teamSummary(teamId: string): Promise<{ id: string; slug: string; name: string }> {
  const t = await Team.findByPk(teamId);
  return t ? { id: t.id, slug: t.slug, name: t.name } : { id: teamId, slug: '', name: '' };
}

export interface NewDelivery {
  webhookId: string;
  eventType: string;
  eventId: string;
  payload: string;
  redeliveryOf?: string | null;
}

/** One row per webhook, all due now, in one statement. */
export async function insertDeliveries(rows: NewDelivery[]): Promise<WebhookDelivery[]> {
  const now = new Date();
  return WebhookDelivery.bulkCreate(rows.map((r) => ({ ...r, redeliveryOf: r.redeliveryOf ?? null, nextAttemptAt: now })));
}

export async function listDeliveries(webhookId: string, page: number, perPage: number): Promise<{ rows: WebhookDelivery[]; total: number }> {
  const { rows, count } = await WebhookDelivery.findAndCountAll({
    where: { webhookId },
    order: [['createdAt', 'DESC'], ['id', 'DESC']],
    limit: perPage,
    offset: (page - 1) * perPage,
  });
  return { rows, total: count };
}

export async function findDelivery(webhookId: string, id: string): Promise<WebhookDelivery | null> {
  return WebhookDelivery.findOne({ where: { id, webhookId } });
}

export async function findDeliveryById(id: string): Promise<WebhookDelivery | null> {
  return WebhookDelivery.findByPk(id);
}

export interface ClaimedDelivery {
  id: string;
  eventType: string;
  payload: string;
  /** The number of this attempt (already counted). */
  attempt: number;
  url: string;
  secret: string;
  active: boolean;
}

/**
 * Claim up to `limit` due deliveries for this process. `FOR UPDATE SKIP LOCKED` makes concurrent
 * claimers (other API instances) skip rows another one is claiming, and the same statement counts the
 * attempt and pushes next_attempt_at out by `leaseMs`, so a claimed row is not due for anyone else while
 * it is being sent. If this process dies mid-send, the row is due again after the lease (at least once).
 */
export async function claimDue(sequelize: Sequelize, limit: number, leaseMs: number): Promise<ClaimedDelivery[]> {
  return sequelize.query<ClaimedDelivery>(
    `WITH due AS (
       SELECT id FROM webhook_deliveries
       WHERE state = 'pending' AND next_attempt_at <= now()
       ORDER BY next_attempt_at
       LIMIT :limit
       FOR UPDATE SKIP LOCKED
     )
     UPDATE webhook_deliveries d
        SET attempts = d.attempts + 1, next_attempt_at = now() + :leaseMs * interval '1 millisecond', updated_at = now()
       FROM due, webhooks w
      WHERE d.id = due.id AND w.id = d.webhook_id
     RETURNING d.id, d.event_type AS "eventType", d.payload, d.attempts AS attempt, w.url, w.secret, w.active`,
    { replacements: { limit, leaseMs }, type: QueryTypes.SELECT },
  );
}

/**
 * Record one attempt's outcome. Only the claimer of this attempt may write it (attempts and state
 * unchanged since the claim); returns false when the lease had run out and someone else took over.
 */
export async function recordAttempt(
  sequelize: Sequelize,
  id: string,
  attempt: number,
  outcome: { state: 'pending' | 'delivered' | 'failed'; nextAttemptAt: Date | null; entry: DeliveryAttempt },
): Promise<boolean> {
  const updated = await sequelize.query<{ id: string }>(
    `UPDATE webhook_deliveries
        SET state = :state, next_attempt_at = :next, last_status_code = :status, last_response_ms = :ms, last_error = :error,
            attempt_log = attempt_log || jsonb_build_array(CAST(:entry AS jsonb)),
            delivered_at = CASE WHEN :state = 'delivered' THEN now() ELSE delivered_at END, updated_at = now()
      WHERE id = :id AND attempts = :attempt AND state = 'pending'
      RETURNING id`,
    {
      replacements: {
        id, attempt, state: outcome.state, next: outcome.nextAttemptAt, status: outcome.entry.statusCode, ms: outcome.entry.responseMs,
        error: outcome.entry.error, entry: JSON.stringify(outcome.entry),
      },
      type: QueryTypes.SELECT,
    },
  );
  return updated.length > 0;
}
