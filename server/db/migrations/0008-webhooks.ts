import type { MigrationContext } from '../migrate';

/**
 * Webhooks (issue 8 part 4): a team's registered receivers and every delivery to them.
 *
 * The secret is kept as is, because signing needs it (a hash would not do); it is returned only when
 * created or rotated and never logged. A delivery keeps the exact body bytes that were signed, so a
 * redelivery sends the same bytes, and a short log of its attempts.
 */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    CREATE TABLE webhooks (
      id UUID PRIMARY KEY DEFAULT gen_random_uuid(),
      team_id UUID NOT NULL REFERENCES teams(id) ON DELETE CASCADE,
      url TEXT NOT NULL,
      description TEXT NOT NULL DEFAULT '',
      events TEXT[] NOT NULL,
      secret TEXT NOT NULL,
      active BOOLEAN NOT NULL DEFAULT true,
      created_by TEXT REFERENCES auth_user(id) ON DELETE SET NULL,
      secret_rotated_at TIMESTAMPTZ,
      created_at TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE INDEX webhooks_team ON webhooks (team_id);

    CREATE TABLE webhook_deliveries (
      id UUID PRIMARY KEY DEFAULT gen_random_uuid(),
      webhook_id UUID NOT NULL REFERENCES webhooks(id) ON DELETE CASCADE,
      event_type TEXT NOT NULL,
      event_id UUID NOT NULL,
      payload TEXT NOT NULL,
      attempts INTEGER NOT NULL DEFAULT 0,
      state TEXT NOT NULL DEFAULT 'pending' CHECK (state IN ('pending', 'delivered', 'failed')),
      next_attempt_at TIMESTAMPTZ,
      last_status_code INTEGER,
      last_response_ms INTEGER,
      last_error TEXT,
      attempt_log JSONB NOT NULL DEFAULT '[]'::jsonb,
      redelivery_of UUID REFERENCES webhook_deliveries(id) ON DELETE SET NULL,
      delivered_at TIMESTAMPTZ,
      created_at TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE INDEX webhook_deliveries_due ON webhook_deliveries (next_attempt_at) WHERE state = 'pending';
    CREATE INDEX webhook_deliveries_webhook ON webhook_deliveries (webhook_id, created_at DESC);
  `);
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query('DROP TABLE webhook_deliveries; DROP TABLE webhooks;');
}
