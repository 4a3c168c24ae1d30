/**
 * When a failed delivery is tried again. The schedule lists the waits after attempt 1, 2, …; a delivery
 * gets `schedule.length + 1` attempts in all, then it is failed. The default 10 s, 1 min, 5 min, 30 min,
 * 2 h grows roughly ×6 per step (exponential backoff, common practice), so a receiver that is down for
 * under ~2.6 hours still gets every event. WEBHOOK_RETRY_SCHEDULE (server/config.ts) overrides it.
 */
export const DEFAULT_RETRY_SCHEDULE_SECONDS: readonly number[] = [10, 60, 300, 1800, 7200];

/** Attempts a delivery gets before it is failed. */
export function maxAttempts(scheduleSeconds: readonly number[]): number {
  return scheduleSeconds.length + 1;
}

/**
 * The wait in milliseconds after attempt number `attempt` (1-based) failed, or null when that was
 * the last attempt.
 */
export function retryDelayMs(attempt: number, scheduleSeconds: readonly number[]): number | null {
  if (!Number.isInteger(attempt) || attempt < 1) throw new RangeError(`attempt must be a whole number ≥ 1, not ${attempt}`);
  const s = scheduleSeconds[attempt - 1];
  return s === undefined ? null : Math.round(s * 1000);
}

/** "10,60,300" → [10, 60, 300]; seconds may be fractional ("0.2,0.2" for tests). Null when not a list of positive numbers. */
export function parseRetrySchedule(text: string): number[] | null {
  const parts = text.split(',').map((p) => p.trim());
  if (!parts.length || parts.length > 20) return null;
  const values = parts.map(Number);
  return values.every((v, i) => parts[i] !== '' && Number.isFinite(v) && v > 0 && v <= 7 * 24 * 3600) ? values : null;
}
