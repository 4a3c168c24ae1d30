import { DataTypes } from 'sequelize';
import PgBoss from 'pg-boss';
import type { MigrationContext } from '../migrate';
import { BOSS_SCHEMA } from '../../jobs/names';

/**
 * Background bakes (issue 7 part 2). A proposal is a `version_bakes` row, not a version: it holds what
 * was proposed (changelog, proposer, the pack source already stored in the bucket under its SHA-256 key,
 * the team's target profiles at that moment) and how far the bake got (queued → baking → done | failed,
 * targets done of total, the failure's target, curve and reason, attempts). The pack version and its
 * artifact rows are inserted in one transaction only when every object is stored; `version_id` then
 * names it — unique, so one bake can never make two versions.
 *
 * pg-boss's own schema is created here too (its published construction SQL for the installed 10.4.2),
 * so every process finds it ready and schema changes stay under the migration lock.
 */
export async function up({ queryInterface: q, sequelize }: MigrationContext): Promise<void> {
  await q.createTable('version_bakes', {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    pack_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'packs', key: 'id' }, onDelete: 'CASCADE' },
    proposed_by: { type: DataTypes.TEXT, allowNull: true, references: { model: 'auth_user', key: 'id' }, onDelete: 'SET NULL' },
    changelog: { type: DataTypes.TEXT, allowNull: false },
    curve_count: { type: DataTypes.INTEGER, allowNull: false },
    source_key: { type: DataTypes.TEXT, allowNull: false },
    source_sha256: { type: DataTypes.TEXT, allowNull: false },
    source_size: { type: DataTypes.INTEGER, allowNull: false },
    /** The target profiles as they were when the version was proposed (a later profile edit does not change the bake). */
    profiles: { type: DataTypes.JSONB, allowNull: false },
    state: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'queued' },
    progress_done: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    progress_total: { type: DataTypes.INTEGER, allowNull: false },
    /** { target, curve, reason } of the last failed attempt; null when none failed. */
    failure: { type: DataTypes.JSONB, allowNull: true },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    version_id: { type: DataTypes.UUID, allowNull: true, unique: true, references: { model: 'pack_versions', key: 'id' }, onDelete: 'SET NULL' },
    job_id: { type: DataTypes.TEXT, allowNull: true },
    started_at: { type: DataTypes.DATE, allowNull: true },
    finished_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await sequelize.query(`ALTER TABLE version_bakes ADD CONSTRAINT version_bakes_state_check CHECK (state IN ('queued', 'baking', 'failed', 'done'))`);
  await sequelize.query(`ALTER TABLE version_bakes ADD CONSTRAINT version_bakes_done_has_version CHECK (state <> 'done' OR version_id IS NOT NULL)`);
  await q.addIndex('version_bakes', ['pack_id', 'state'], { name: 'version_bakes_pack_state' });
  const [rows] = await sequelize.query(`SELECT 1 FROM information_schema.schemata WHERE schema_name = '${BOSS_SCHEMA}'`);
  if (rows.length === 0) await sequelize.query(PgBoss.getConstructionPlans(BOSS_SCHEMA));
}

export async function down({ queryInterface: q, sequelize }: MigrationContext): Promise<void> {
  await q.dropTable('version_bakes');
  await sequelize.query(`DROP SCHEMA IF EXISTS ${BOSS_SCHEMA} CASCADE`);
}
