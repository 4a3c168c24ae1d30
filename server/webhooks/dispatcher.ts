/**
 * The in-process dispatcher: on an interval (WEBHOOK_POLL_MS), and at once when an event was enqueued
 * in this process, it claims due deliveries (FOR UPDATE SKIP LOCKED, ./webhooks.repository.ts claimDue)
 * and POSTs them. A 2xx is delivered; anything else is tried again after the retry schedule's wait
 * (./backoff.ts) until the attempts run out, then the delivery is failed. Several API instances may run
 * a dispatcher each on one database: each claimed attempt is made by one of them.
 *
 * Started by startServer() (server/main.ts) and stopped by its close(); the bake worker does not run one.
 */
import type { AppContext } from '../context';
import { maxAttempts, retryDelayMs } from './backoff';
import { postDelivery } from './deliver';
import { claimDue, recordAttempt, type ClaimedDelivery } from './webhooks.repository';

const BATCH = 10;
/** A claim lasts one timeout plus this margin; after that an unfinished attempt is due again. */
const LEASE_MARGIN_MS = 30_000;

export interface WebhookDispatcher {
  /** Claim and send what is due now, until nothing is; resolves with the number of attempts made. */
  runOnce(): Promise<number>;
  /** Look for due deliveries soon (an event was just enqueued). */
  wake(): void;
  /** Stop the timer and wait for attempts under way. */
  stop(): Promise<void>;
}

const running = new WeakMap<AppContext, WebhookDispatcher>();

/** Wake this process's dispatcher, if it runs one (the subscriber calls this after enqueuing). */
export function wakeDispatcher(ctx: AppContext): void {
  running.get(ctx)?.wake();
}

async function attempt(ctx: AppContext, d: ClaimedDelivery): Promise<void> {
  const cfg = ctx.config.webhooks;
  const outcome = d.active
    ? await postDelivery({ url: d.url, secret: d.secret, body: d.payload, deliveryId: d.id, eventType: d.eventType, timeoutMs: cfg.timeoutMs, allowPrivateTargets: cfg.allowPrivateTargets })
    : { statusCode: null, responseMs: 0, error: 'The webhook is turned off; not sent.' };
  const delivered = outcome.error === null;
  const wait = delivered || !d.active ? null : retryDelayMs(d.attempt, cfg.retryScheduleSeconds);
  const state = delivered ? 'delivered' : wait === null ? 'failed' : 'pending';
  const entry = { attempt: d.attempt, at: new Date().toISOString(), ...outcome };
  const recorded = await recordAttempt(ctx.sequelize, d.id, d.attempt, { state, nextAttemptAt: wait === null ? null : new Date(Date.now() + wait), entry });
  if (!recorded) ctx.logger.warn({ delivery: d.id, attempt: d.attempt }, 'webhook attempt finished after its claim ran out; outcome not recorded');
  else if (state !== 'delivered') ctx.logger.info({ delivery: d.id, attempt: d.attempt, of: maxAttempts(cfg.retryScheduleSeconds), state, status: outcome.statusCode, error: outcome.error }, 'webhook attempt failed');
}

export function createWebhookDispatcher(ctx: AppContext): WebhookDispatcher {
  const cfg = ctx.config.webhooks;
  let timer: NodeJS.Timeout | null = null;
  let stopped = false;
  let current: Promise<number> | null = null;
  let again = false;

  async function drain(): Promise<number> {
    let total = 0;
    for (;;) {
      const claimed = await claimDue(ctx.sequelize, BATCH, cfg.timeoutMs + LEASE_MARGIN_MS);
      await Promise.all(claimed.map((d) => attempt(ctx, d).catch((err: Error) => ctx.logger.error({ delivery: d.id, err: err.message }, 'webhook attempt could not be recorded'))));
      total += claimed.length;
      if (claimed.length < BATCH || stopped) return total;
    }
  }

  function runOnce(): Promise<number> {
    if (current) {
      again = true;
      return current;
    }
    current = drain()
      .catch((err: Error) => {
        ctx.logger.error({ err: err.message }, 'webhook dispatcher could not claim deliveries');
        return 0;
      })
      .finally(() => {
        current = null;
        if (again && !stopped) {
          again = false;
          void runOnce();
        }
      });
    return current;
  }

  function schedule(ms: number) {
    if (stopped) return;
    if (timer) clearTimeout(timer);
    timer = setTimeout(() => {
      timer = null;
      void runOnce().finally(() => schedule(cfg.pollMs));
    }, ms);
    timer.unref();
  }

  const dispatcher: WebhookDispatcher = {
    runOnce,
    wake: () => {
      if (!stopped) void runOnce();
    },
    async stop() {
      stopped = true;
      if (timer) clearTimeout(timer);
      timer = null;
      running.delete(ctx);
      await current;
    },
  };
  running.set(ctx, dispatcher);
  schedule(cfg.pollMs);
  return dispatcher;
}
