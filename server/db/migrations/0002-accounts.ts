import type { MigrationContext } from '../migrate';

/**
 * Accounts (issue 3): people, their lucia sessions, team memberships with a role, e-mail invitations,
 * password-reset tokens and read-only service tokens.
 *
 * `auth_user` / `auth_session` are the tables @lucia-auth/adapter-postgresql reads (id TEXT, user_id,
 * expires_at TIMESTAMPTZ); every other column of auth_user reaches lucia's getUserAttributes.
 * Every secret (invitation, reset, service token) is stored only as its SHA-256 hex digest.
 */
export async function up({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    CREATE TABLE auth_user (
      id TEXT PRIMARY KEY,
      email TEXT NOT NULL,
      name TEXT NOT NULL,
      password_hash TEXT NOT NULL,
      studio_id UUID NOT NULL REFERENCES studios(id) ON DELETE CASCADE,
      created_at TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX auth_user_email_unique ON auth_user (lower(email));

    CREATE TABLE auth_session (
      id TEXT PRIMARY KEY,
      user_id TEXT NOT NULL REFERENCES auth_user(id) ON DELETE CASCADE,
      expires_at TIMESTAMPTZ NOT NULL
    );
    CREATE INDEX auth_session_user ON auth_session (user_id);

    CREATE TABLE memberships (
      id UUID PRIMARY KEY DEFAULT gen_random_uuid(),
      team_id UUID NOT NULL REFERENCES teams(id) ON DELETE CASCADE,
      user_id TEXT NOT NULL REFERENCES auth_user(id) ON DELETE CASCADE,
      role TEXT NOT NULL CHECK (role IN ('admin', 'lead', 'animator', 'engineer', 'viewer')),
      created_at TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at TIMESTAMPTZ NOT NULL DEFAULT now(),
      UNIQUE (team_id, user_id)
    );
    CREATE INDEX memberships_user ON memberships (user_id);

    CREATE TABLE invitations (
      id UUID PRIMARY KEY DEFAULT gen_random_uuid(),
      team_id UUID NOT NULL REFERENCES teams(id) ON DELETE CASCADE,
      email TEXT NOT NULL,
      role TEXT NOT NULL CHECK (role IN ('admin', 'lead', 'animator', 'engineer', 'viewer')),
      token_hash TEXT NOT NULL,
      invited_by TEXT REFERENCES auth_user(id) ON DELETE SET NULL,
      expires_at TIMESTAMPTZ NOT NULL,
      accepted_at TIMESTAMPTZ,
      created_at TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE INDEX invitations_team ON invitations (team_id);

    CREATE TABLE password_resets (
      id UUID PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id TEXT NOT NULL REFERENCES auth_user(id) ON DELETE CASCADE,
      token_hash TEXT NOT NULL,
      expires_at TIMESTAMPTZ NOT NULL,
      used_at TIMESTAMPTZ,
      created_at TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at TIMESTAMPTZ NOT NULL DEFAULT now()
    );

    CREATE TABLE service_tokens (
      id UUID PRIMARY KEY DEFAULT gen_random_uuid(),
      team_id UUID NOT NULL REFERENCES teams(id) ON DELETE CASCADE,
      name TEXT NOT NULL,
      token_hash TEXT NOT NULL,
      pack_slugs TEXT[],
      created_by TEXT REFERENCES auth_user(id) ON DELETE SET NULL,
      last_used_at TIMESTAMPTZ,
      revoked_at TIMESTAMPTZ,
      created_at TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE INDEX service_tokens_team ON service_tokens (team_id);
  `);
}

export async function down({ sequelize }: MigrationContext): Promise<void> {
  await sequelize.query(`
    DROP TABLE service_tokens; DROP TABLE password_resets; DROP TABLE invitations;
    DROP TABLE memberships; DROP TABLE auth_session; DROP TABLE auth_user;
  `);
}
