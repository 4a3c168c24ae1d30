import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrate';

/**
 * Reviews of pack versions: a lead approves a version or requests changes, with a comment. Every review
 * is kept; the version's `state` (proposed → approved | changes-requested) follows the latest one.
 */
export async function up({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.createTable('version_reviews', {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    version_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'pack_versions', key: 'id' }, onDelete: 'CASCADE' },
    reviewer_id: { type: DataTypes.TEXT, allowNull: true, references: { model: 'auth_user', key: 'id' }, onDelete: 'SET NULL' },
    decision: { type: DataTypes.TEXT, allowNull: false },
    comment: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await q.addIndex('version_reviews', ['version_id', 'created_at'], { name: 'version_reviews_version' });
  await q.sequelize.query("ALTER TABLE version_reviews ADD CONSTRAINT version_reviews_decision CHECK (decision IN ('approve', 'request-changes'))");
}

export async function down({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.dropTable('version_reviews');
}
