import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrate';

/**
 * Channels: named pointers per pack (`shipping`, `nightly` …) at an approved version. Moving one is a
 * release; every move is kept in channel_moves with who and when, so rolling back is moving it back.
 */
export async function up({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.createTable('channels', {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    pack_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'packs', key: 'id' }, onDelete: 'CASCADE' },
    name: { type: DataTypes.TEXT, allowNull: false },
    version_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'pack_versions', key: 'id' }, onDelete: 'RESTRICT' },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await q.addIndex('channels', ['pack_id', 'name'], { unique: true, name: 'channels_pack_name_unique' });
  await q.createTable('channel_moves', {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    channel_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'channels', key: 'id' }, onDelete: 'CASCADE' },
    from_version_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'pack_versions', key: 'id' }, onDelete: 'RESTRICT' },
    to_version_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'pack_versions', key: 'id' }, onDelete: 'RESTRICT' },
    moved_by: { type: DataTypes.TEXT, allowNull: true, references: { model: 'auth_user', key: 'id' }, onDelete: 'SET NULL' },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await q.addIndex('channel_moves', ['channel_id', 'created_at'], { name: 'channel_moves_channel' });
}

export async function down({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.dropTable('channel_moves');
  await q.dropTable('channels');
}
