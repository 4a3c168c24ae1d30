/**
 * Durable mail: a message is stored in `mail_outbox` (migration 0011) before anything is sent, then
 * delivered from there. `queueMail` stores it and tries it at once (without making the caller wait);
 * when the mail server is down the row stays pending with the error and a next attempt time, and the
 * outbox sender of every app process (started with the context) retries it: 5 s, 10 s, 20 s … doubling,
 * at most 10 minutes apart, for MAX_ATTEMPTS attempts (about two days). Claims use
 * UPDATE … WHERE id IN (SELECT … FOR UPDATE SKIP LOCKED) and push `next_attempt_at` past the send timeout,
 * so two instances never send one row at the same moment and a process that dies mid-send leaves the
 * row to be retried (at-least-once delivery, common practice for an outbox). A pending row keeps the
 * whole message (links included, so it can still be sent); a sent row keeps only recipient and subject.
 */
import { QueryTypes } from 'sequelize';
import type { AppContext } from '../context';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html?: string;
}

export const MAX_ATTEMPTS = 300;
const LEASE_SECONDS = 60;
const POLL_MS = 2_000;

/** Seconds until the next attempt after `attempts` failed ones: 5 · 2^(n−1), at most 600. */
export function retryDelaySeconds(attempts: number): number {
  return Math.min(600, 5 * 2 ** Math.max(0, attempts - 1));
}

interface Row {
  id: string;
  from_address: string;
  to_address: string;
  subject: string;
  text_body: string;
  html_body: string | null;
  attempts: number;
}

/** Stores the message; delivery is attempted right after, in the background. Resolves once stored. */
export async function queueMail(ctx: AppContext, mail: OutgoingMail): Promise<string> {
  const [rows] = (await ctx.sequelize.query(
    `INSERT INTO mail_outbox (id, from_address, to_address, subject, text_body, html_body, next_attempt_at, created_at, updated_at)
     VALUES (gen_random_uuid(), :from, :to, :subject, :text, :html, now(), now(), now()) RETURNING id`,
    { replacements: { from: ctx.config.mailFrom, to: mail.to, subject: mail.subject, text: mail.text, html: mail.html ?? null } },
  )) as [{ id: string }[], unknown];
  const id = rows[0]!.id;
  void deliverDue(ctx, id).catch((err) => ctx.logger.warn({ err: (err as Error).message }, 'mail outbox: delivery pass failed'));
  return id;
}

/** Claims due rows (or just `onlyId`) and sends them; returns how many were sent. */
export async function deliverDue(ctx: AppContext, onlyId?: string): Promise<number> {
  if (!ctx.mail) return 0;
  const claimed = await ctx.sequelize.query<Row>(
    `UPDATE mail_outbox SET attempts = attempts + 1, next_attempt_at = now() + make_interval(secs => :lease), updated_at = now()
     WHERE id IN (
       SELECT id FROM mail_outbox
       WHERE sent_at IS NULL AND next_attempt_at <= now() AND attempts < :max ${onlyId ? 'AND id = :onlyId' : ''}
       ORDER BY created_at LIMIT 20 FOR UPDATE SKIP LOCKED)
     RETURNING id, from_address, to_address, subject, text_body, html_body, attempts`,
    { replacements: { lease: LEASE_SECONDS, max: MAX_ATTEMPTS, onlyId: onlyId ?? null }, type: QueryTypes.SELECT },
  );
  let sent = 0;
  for (const row of claimed) {
    try {
      await ctx.mail.sendMail({ from: row.from_address, to: row.to_address, subject: row.subject, text: row.text_body, ...(row.html_body ? { html: row.html_body } : {}) });
      // once delivered, the body is dropped: it may hold a reset or invitation link, which is stored
      // nowhere else in plain text (only its SHA-256); recipient and subject stay for the record
      await ctx.sequelize.query("UPDATE mail_outbox SET sent_at = now(), last_error = NULL, text_body = '', html_body = NULL, updated_at = now() WHERE id = :id", { replacements: { id: row.id } });
      sent++;
    } catch (err) {
      const message = (err as Error).message;
      await ctx.sequelize.query(
        'UPDATE mail_outbox SET last_error = :message, next_attempt_at = now() + make_interval(secs => :delay), updated_at = now() WHERE id = :id',
        { replacements: { id: row.id, message: message.slice(0, 1000), delay: retryDelaySeconds(row.attempts) } },
      );
      ctx.logger.warn({ err: message, mailId: row.id, attempts: row.attempts, retryInSeconds: retryDelaySeconds(row.attempts) }, 'mail not sent yet; will retry');
    }
  }
  return sent;
}

const senders = new WeakMap<AppContext, NodeJS.Timeout>();

/** Starts this process's outbox sender (a timer that does not keep the process alive). */
export function startMailOutbox(ctx: AppContext, pollMs = POLL_MS): void {
  if (!ctx.mail || senders.has(ctx)) return;
  let running = false;
  let failing = false;
  const timer = setInterval(() => {
    if (running) return;
    running = true;
    deliverDue(ctx)
      .then(() => { failing = false; })
      .catch((err) => {
        // the database may be down too: say so once per outage, not every tick
        if (!failing) ctx.logger.warn({ err: (err as Error).message }, 'mail outbox: cannot read pending mail');
        failing = true;
      })
      .finally(() => { running = false; });
  }, pollMs);
  timer.unref();
  senders.set(ctx, timer);
}

export function stopMailOutbox(ctx: AppContext): void {
  const timer = senders.get(ctx);
  if (timer) clearInterval(timer);
  senders.delete(ctx);
}
