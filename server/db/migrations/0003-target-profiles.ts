import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrate';

/**
 * Target profiles, one set per team. The profile itself (tolerance, kernel, layout, encoding, byte cap,
 * sample-count rule, output) is the JSON validated by shared/bake/profile.ts; name is a column so it can
 * be unique per team. `version` counts edits (optimistic concurrency for the profiles form).
 */
export async function up({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.createTable('target_profiles', {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    team_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'teams', key: 'id' }, onDelete: 'CASCADE' },
    name: { type: DataTypes.TEXT, allowNull: false },
    spec: { type: DataTypes.JSONB, allowNull: false },
    position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await q.addIndex('target_profiles', ['team_id', 'name'], { unique: true, name: 'target_profiles_team_name_unique' });
}

export async function down({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.dropTable('target_profiles');
}
