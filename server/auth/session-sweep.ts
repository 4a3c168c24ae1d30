/**
 * Periodic delete of expired lucia sessions (lucia's `deleteExpiredSessions`, rows of auth_session
 * whose expires_at has passed). Every API instance runs the timer, but a sweep only happens in the
 * instance that wins `pg_try_advisory_lock` (PostgreSQL manual, "Advisory Lock Functions") for it, so
 * at most one instance sweeps at a time; the others skip that turn. Deleting expired rows is
 * idempotent, so a sweep a moment after another one only finds nothing.
 */
import type { AppContext } from '../context';
import { luciaFor } from './lucia';

/** Advisory-lock key of the sweep (any bigint the app does not use elsewhere; migrations use 7_270_001). */
export const SESSION_SWEEP_LOCK = 7_270_012;
const DEFAULT_EVERY_MS = 15 * 60_000;

export interface SessionSweep {
  /** Run one sweep now; resolves to whether this instance held the lock and swept. */
  runOnce(): Promise<boolean>;
  stop(): Promise<void>;
}

export function startSessionSweep(ctx: AppContext, opts: { everyMs?: number } = {}): SessionSweep {
  let running: Promise<boolean> | null = null;
  let stopped = false;

  const runOnce = async (): Promise<boolean> => {
    const client = await ctx.pgPool.connect();
    try {
      const { rows } = await client.query<{ ok: boolean }>('SELECT pg_try_advisory_lock($1) AS ok', [SESSION_SWEEP_LOCK]);
      if (!rows[0]?.ok) return false;
      try {
        await luciaFor(ctx).deleteExpiredSessions();
        return true;
      } finally {
        await client.query('SELECT pg_advisory_unlock($1)', [SESSION_SWEEP_LOCK]);
      }
    } finally {
      client.release();
    }
  };

  const tick = () => {
    if (stopped || running) return;
    running = runOnce()
      .catch((err) => {
        ctx.logger.warn({ err: (err as Error).message }, 'expired-session sweep failed');
        return false;
      })
      .finally(() => (running = null));
  };

  const timer = setInterval(tick, opts.everyMs ?? DEFAULT_EVERY_MS);
  timer.unref();
  return {
    runOnce,
    async stop() {
      stopped = true;
      clearInterval(timer);
      await running;
    },
  };
}
