import type { MigrationContext } from '../migrate';

/**
 * Shared rate-limit counters (server/http/pg-rate-limit-store.ts): one row per limiter key and
 * fixed window, so every app instance behind a load balancer counts the same hits.
 * `reset_at` ends the current window; rows past it are swept (index rate_limits_reset_at).
 */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    CREATE TABLE rate_limits (
      key text PRIMARY KEY,
      hits integer NOT NULL CHECK (hits >= 0),
      reset_at timestamptz NOT NULL
    )`);
  await sequelize.query('CREATE INDEX rate_limits_reset_at ON rate_limits (reset_at)');
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query('DROP TABLE IF EXISTS rate_limits');
}
