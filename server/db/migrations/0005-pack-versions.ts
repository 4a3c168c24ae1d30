import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrate';

/**
 * Pack versions (v1, v2 … per pack, immutable) and their artifacts. The bytes live in the S3 bucket under
 * content-addressed keys (`sha256/<hex>`); these rows are the manifest: for a version its source object
 * (every curve document, canonical JSON) and for each artifact the target profile, format, key, SHA-256
 * and size. Rows are inserted in one transaction after every object is stored, so a version is visible
 * only when complete. `state` is `proposed` until a lead reviews it (a later step).
 */
export async function up({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.createTable('pack_versions', {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    pack_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'packs', key: 'id' }, onDelete: 'CASCADE' },
    number: { type: DataTypes.INTEGER, allowNull: false },
    changelog: { type: DataTypes.TEXT, allowNull: false },
    state: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'proposed' },
    proposed_by: { type: DataTypes.TEXT, allowNull: true, references: { model: 'auth_user', key: 'id' }, onDelete: 'SET NULL' },
    curve_count: { type: DataTypes.INTEGER, allowNull: false },
    source_key: { type: DataTypes.TEXT, allowNull: false },
    source_sha256: { type: DataTypes.TEXT, allowNull: false },
    source_size: { type: DataTypes.INTEGER, allowNull: false },
    bake_summary: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await q.addIndex('pack_versions', ['pack_id', 'number'], { unique: true, name: 'pack_versions_pack_number_unique' });
  await q.createTable('version_artifacts', {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    version_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'pack_versions', key: 'id' }, onDelete: 'CASCADE' },
    position: { type: DataTypes.INTEGER, allowNull: false },
    /** null for the version's source. */
    profile_name: { type: DataTypes.TEXT, allowNull: true },
    format: { type: DataTypes.TEXT, allowNull: false },
    file_name: { type: DataTypes.TEXT, allowNull: false },
    media_type: { type: DataTypes.TEXT, allowNull: false },
    key: { type: DataTypes.TEXT, allowNull: false },
    sha256: { type: DataTypes.TEXT, allowNull: false },
    size: { type: DataTypes.INTEGER, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await q.addIndex('version_artifacts', ['version_id', 'position'], { unique: true, name: 'version_artifacts_version_position_unique' });
}

export async function down({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.dropTable('version_artifacts');
  await q.dropTable('pack_versions');
}
