/**
 * Webhooks: the API bodies (validated at the server's edge, checked in the form before sending) and
 * the answers' shapes. Messages name the field. Whether http:// and private addresses are allowed is
 * the server's configuration (WEBHOOK_ALLOW_PRIVATE_TARGETS); the list answer says which applies.
 */
import { z } from 'zod';

/** The team events a webhook can subscribe to (server/events/team-events.ts). */
export const WEBHOOK_EVENTS = ['version.proposed', 'version.approved', 'version.changes-requested', 'channel.moved'] as const;
export type WebhookEvent = (typeof WEBHOOK_EVENTS)[number];

export const WEBHOOK_EVENT_LABEL: Record<WebhookEvent, string> = {
  'version.proposed': 'Version proposed',
  'version.approved': 'Version approved',
  'version.changes-requested': 'Changes requested',
  'channel.moved': 'Channel moved (release)',
};

/** Sent by "Send a test ping" only; not subscribable. */
export const PING_EVENT = 'ping';

export const webhookUrlField = z
  .string({ message: 'URL is required.' })
  .trim()
  .min(1, 'URL is required.')
  .max(2000, 'URL must be at most 2000 characters.')
  .pipe(z.url({ protocol: /^https?$/, message: 'URL must be an absolute http:// or https:// address, such as https://builds.example.test/hooks/tangentry.' }))
  .refine((v) => !/^https?:\/\/[^/?#]*@/i.test(v), 'URL must not carry a user name or password.');

export const webhookEventsField = z
  .array(z.enum(WEBHOOK_EVENTS, { message: `Each event must be one of ${WEBHOOK_EVENTS.join(', ')}.` }), { message: 'Events must be a list.' })
  .min(1, 'Choose at least one event.')
  .transform((list) => WEBHOOK_EVENTS.filter((e) => list.includes(e)));

export const webhookDescriptionField = z.string({ message: 'Description must be text.' }).trim().max(200, 'Description must be at most 200 characters.');

export const createWebhookSchema = z.object({
  url: webhookUrlField,
  events: webhookEventsField,
  description: webhookDescriptionField.default(''),
});
export type CreateWebhookInput = z.input<typeof createWebhookSchema>;

export const updateWebhookSchema = z
  .object({
    url: webhookUrlField.optional(),
    events: webhookEventsField.optional(),
    description: webhookDescriptionField.optional(),
    active: z.boolean({ message: 'Active must be true or false.' }).optional(),
  })
  .refine((v) => Object.values(v).some((x) => x !== undefined), { message: 'Send at least one of url, events, description, active.', path: ['url'] });
export type UpdateWebhookInput = z.input<typeof updateWebhookSchema>;

export const deliveriesQuerySchema = z.object({
  page: z.coerce.number({ message: 'Page must be a number.' }).int('Page must be a whole number.').min(1, 'Page starts at 1.').max(100_000, 'Page is too large.').default(1),
  perPage: z.coerce.number({ message: 'perPage must be a number.' }).int('perPage must be a whole number.').min(1, 'perPage must be 1–100.').max(100, 'perPage must be 1–100.').default(20),
});

export type DeliveryState = 'pending' | 'delivered' | 'failed';

export interface WebhookDto {
  id: string;
  url: string;
  description: string;
  events: WebhookEvent[];
  active: boolean;
  createdAt: string;
  updatedAt: string;
  secretRotatedAt: string | null;
  /** The newest delivery's state, for the table (null: nothing sent yet). */
  lastDelivery: { state: DeliveryState; attempts: number; statusCode: number | null; at: string } | null;
}

export interface DeliveryAttemptDto {
  attempt: number;
  at: string;
  statusCode: number | null;
  responseMs: number;
  error: string | null;
}

export interface DeliveryDto {
  id: string;
  eventType: string;
  eventId: string;
  state: DeliveryState;
  attempts: number;
  maxAttempts: number;
  nextAttemptAt: string | null;
  lastStatusCode: number | null;
  lastResponseMs: number | null;
  lastError: string | null;
  log: DeliveryAttemptDto[];
  redeliveryOf: string | null;
  deliveredAt: string | null;
  createdAt: string;
}

/** What the webhooks list says about allowed targets, so the form can tell the admin. */
export interface WebhookPolicyDto {
  httpsOnly: boolean;
  privateAddressesAllowed: boolean;
  retryScheduleSeconds: number[];
  timeoutMs: number;
}

export interface DeliveriesPageDto {
  deliveries: DeliveryDto[];
  page: number;
  perPage: number;
  total: number;
}
