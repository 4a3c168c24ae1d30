/**
 * Schema changes only through migrations, run by umzug with the state kept in
 * the `schema_migrations` table. Migrations are TypeScript modules listed in
 * ./migrations/index.ts, each exporting up() and down().
 */
import { Umzug, SequelizeStorage } from 'umzug';
import type { QueryInterface, Sequelize } from 'sequelize';
import pg from 'pg';
import { migrations } from './migrations';

export type MigrationContext = { queryInterface: QueryInterface; sequelize: Sequelize };

export function createMigrator(sequelize: Sequelize) {
  return new Umzug<MigrationContext>({
    migrations: migrations.map((m) => ({
      name: m.name,
      up: ({ context }) => m.up(context),
      down: ({ context }) => m.down(context),
    })),
    context: { queryInterface: sequelize.getQueryInterface(), sequelize },
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}

const MIGRATION_LOCK = 7_270_001;

/**
 * Run every pending migration; returns the names applied. Safe to call on every
 * start and from several processes at once: a session-level advisory lock on its
 * own connection lets one migrator run while the others wait.
 */
export async function migrate(sequelize: Sequelize, databaseUrl: string): Promise<string[]> {
  const lock = new pg.Client({ connectionString: databaseUrl });
  await lock.connect();
  try {
    await lock.query('SELECT pg_advisory_lock($1)', [MIGRATION_LOCK]);
    const done = await createMigrator(sequelize).up();
    return done.map((m) => m.name);
  } finally {
    await lock.query('SELECT pg_advisory_unlock($1)', [MIGRATION_LOCK]).catch(() => undefined);
    await lock.end();
  }
}
