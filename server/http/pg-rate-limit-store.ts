/**
 * A PostgreSQL store for express-rate-limit (its `Store` interface: init, get, increment, decrement,
 * resetKey), so several app instances behind a load balancer share one count per client.
 *
 * Fixed windows: the first hit of a key opens a window of `windowMs`; hits inside it add one; the
 * first hit after `reset_at` starts a new window at 1. One statement per hit —
 * `INSERT … ON CONFLICT (key) DO UPDATE … RETURNING` (PostgreSQL manual, "INSERT", ON CONFLICT
 * clause) — takes a row lock, so concurrent hits from any instance are counted exactly once each.
 * Expired rows are swept lazily: at most once a minute per store, a DELETE of rows whose window
 * ended, run beside a hit and never awaited by it.
 *
 * Connections: one small pg pool per database URL in this process (limiters are built from the
 * configuration alone), closed by closeRateLimitPools() when the server stops.
 */
import pg from 'pg';
import type { ClientRateLimitInfo, IncrementResponse, Options, Store } from 'express-rate-limit';

const pools = new Map<string, pg.Pool>();

function poolFor(databaseUrl: string): pg.Pool {
  let pool = pools.get(databaseUrl);
  if (!pool) {
    // allowExitOnIdle: an idle pool never keeps a process (or a test worker) alive
    pool = new pg.Pool({ connectionString: databaseUrl, max: 3, idleTimeoutMillis: 5_000, allowExitOnIdle: true });
    pool.on('error', () => undefined); // an idle connection dropped by the server: the next query reconnects
    pools.set(databaseUrl, pool);
  }
  return pool;
}

/** Close every rate-limit pool of this process (server shutdown). */
export async function closeRateLimitPools(): Promise<void> {
  const all = [...pools.values()];
  pools.clear();
  await Promise.all(all.map((p) => p.end().catch(() => undefined)));
}

const SWEEP_EVERY_MS = 60_000;

export class PgRateLimitStore implements Store {
  windowMs = 60_000;
  /** Keys of different limiters never meet: each store writes `<prefix><client key>`. */
  readonly prefix: string;
  /** Counts are shared across processes: express-rate-limit must not assume a per-process store. */
  readonly localKeys = false;
  private lastSweep = 0;
  private readonly databaseUrl: string;

  constructor(opts: { databaseUrl: string; prefix: string }) {
    this.databaseUrl = opts.databaseUrl;
    this.prefix = opts.prefix;
  }

  private get pool(): pg.Pool {
    return poolFor(this.databaseUrl);
  }

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const { rows } = await this.pool.query<{ hits: number; reset_at: Date }>(
      'SELECT hits, reset_at FROM rate_limits WHERE key = $1 AND reset_at > now()',
      [this.prefix + key],
    );
    return rows[0] ? { totalHits: rows[0].hits, resetTime: rows[0].reset_at } : undefined;
  }

  async increment(key: string): Promise<IncrementResponse> {
    this.maybeSweep();
    const { rows } = await this.pool.query<{ hits: number; reset_at: Date }>(
      `INSERT INTO rate_limits AS r (key, hits, reset_at)
         VALUES ($1, 1, now() + make_interval(secs => $2::double precision / 1000))
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN r.reset_at <= now() THEN 1 ELSE r.hits + 1 END,
         reset_at = CASE WHEN r.reset_at <= now() THEN EXCLUDED.reset_at ELSE r.reset_at END
       RETURNING hits, reset_at`,
      [this.prefix + key, this.windowMs],
    );
    return { totalHits: rows[0]!.hits, resetTime: rows[0]!.reset_at };
  }

  /** Take one hit back (skipSuccessfulRequests / skipFailedRequests), only inside the current window. */
  async decrement(key: string): Promise<void> {
    await this.pool.query('UPDATE rate_limits SET hits = hits - 1 WHERE key = $1 AND hits > 0 AND reset_at > now()', [this.prefix + key]);
  }

  async resetKey(key: string): Promise<void> {
    await this.pool.query('DELETE FROM rate_limits WHERE key = $1', [this.prefix + key]);
  }

  /** Delete every row whose window has ended (all limiters share the table, so any store may sweep it). */
  async sweep(): Promise<number> {
    const res = await this.pool.query('DELETE FROM rate_limits WHERE reset_at <= now()');
    return res.rowCount ?? 0;
  }

  private maybeSweep(): void {
    const now = Date.now();
    if (now - this.lastSweep < SWEEP_EVERY_MS) return;
    this.lastSweep = now;
    this.sweep().catch(() => undefined); // a failed sweep is retried a minute later; the hit itself is unaffected
  }
}
