import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrate';

/**
 * Packs of curves per team, and the curves in them. A pack's slug is unique in its team (URLs and
 * service-token limits name packs by slug). A curve keeps its whole validated document (shared/curve)
 * as JSONB; `name` mirrors document.name so it can be unique in the pack (artifacts name curves).
 * `revision` counts saves of a curve (optimistic concurrency for the editor and the API).
 */
export async function up({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.createTable('packs', {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    team_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'teams', key: 'id' }, onDelete: 'CASCADE' },
    name: { type: DataTypes.TEXT, allowNull: false },
    slug: { type: DataTypes.TEXT, allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    frame_rate: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 60 },
    tags: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    archived: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await q.addIndex('packs', ['team_id', 'slug'], { unique: true, name: 'packs_team_slug_unique' });
  await q.createTable('curves', {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    pack_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'packs', key: 'id' }, onDelete: 'CASCADE' },
    name: { type: DataTypes.TEXT, allowNull: false },
    document: { type: DataTypes.JSONB, allowNull: false },
    position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    revision: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await q.addIndex('curves', ['pack_id', 'name'], { unique: true, name: 'curves_pack_name_unique' });
  await q.addIndex('curves', ['pack_id', 'position'], { name: 'curves_pack_position' });
}

export async function down({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.dropTable('curves');
  await q.dropTable('packs');
}
