import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrate';

/**
 * Three tables fed by team events (server/events/team-events.ts):
 *   activity          one row per event in a team, kept with the words it needs (pack slug and name,
 *                     subject label) so renames and deletions later do not rewrite history;
 *   version_comments  comments on a pack version, optionally pinned to one curve and a time on it;
 *   notifications     in-app notices for one person, unread until read_at is set.
 * The activity id is a bigserial: the table is read newest first by (at, id), the keyset the API's cursors name.
 */
export async function up({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.createTable('activity', {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    team_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'teams', key: 'id' }, onDelete: 'CASCADE' },
    actor_id: { type: DataTypes.TEXT, allowNull: true, references: { model: 'auth_user', key: 'id' }, onDelete: 'SET NULL' },
    type: { type: DataTypes.TEXT, allowNull: false },
    pack_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'packs', key: 'id' }, onDelete: 'SET NULL' },
    pack_slug: { type: DataTypes.TEXT, allowNull: true },
    pack_name: { type: DataTypes.TEXT, allowNull: true },
    subject_kind: { type: DataTypes.TEXT, allowNull: false },
    subject_id: { type: DataTypes.TEXT, allowNull: true },
    subject_label: { type: DataTypes.TEXT, allowNull: false },
    data: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    at: { type: DataTypes.DATE, allowNull: false },
  });
  await q.sequelize.query('CREATE INDEX activity_team_at ON activity (team_id, at DESC, id DESC)');
  await q.sequelize.query('CREATE INDEX activity_team_type_at ON activity (team_id, type, at DESC, id DESC)');
  await q.sequelize.query('CREATE INDEX activity_team_pack_at ON activity (team_id, pack_id, at DESC, id DESC)');
  await q.sequelize.query('CREATE INDEX activity_team_actor_at ON activity (team_id, actor_id, at DESC, id DESC)');
  await q.sequelize.query('CREATE INDEX activity_team_subject_at ON activity (team_id, subject_kind, at DESC, id DESC)');
  await q.sequelize.query("ALTER TABLE activity ADD CONSTRAINT activity_subject_kind CHECK (subject_kind IN ('pack', 'curve', 'version', 'profile', 'channel'))");

  await q.createTable('version_comments', {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    version_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'pack_versions', key: 'id' }, onDelete: 'CASCADE' },
    author_id: { type: DataTypes.TEXT, allowNull: true, references: { model: 'auth_user', key: 'id' }, onDelete: 'SET NULL' },
    body: { type: DataTypes.TEXT, allowNull: false },
    curve_name: { type: DataTypes.TEXT, allowNull: true },
    time: { type: DataTypes.DOUBLE, allowNull: true },
    review_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'version_reviews', key: 'id' }, onDelete: 'SET NULL' },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await q.addIndex('version_comments', ['version_id', 'created_at'], { name: 'version_comments_version' });
  await q.sequelize.query('ALTER TABLE version_comments ADD CONSTRAINT version_comments_time_needs_curve CHECK (time IS NULL OR curve_name IS NOT NULL)');

  await q.createTable('notifications', {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    user_id: { type: DataTypes.TEXT, allowNull: false, references: { model: 'auth_user', key: 'id' }, onDelete: 'CASCADE' },
    type: { type: DataTypes.TEXT, allowNull: false },
    team_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'teams', key: 'id' }, onDelete: 'CASCADE' },
    pack_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'packs', key: 'id' }, onDelete: 'CASCADE' },
    version_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'pack_versions', key: 'id' }, onDelete: 'CASCADE' },
    text: { type: DataTypes.TEXT, allowNull: false },
    link: { type: DataTypes.TEXT, allowNull: false },
    read_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await q.sequelize.query('CREATE INDEX notifications_user_created ON notifications (user_id, created_at DESC, id DESC)');
  await q.sequelize.query('CREATE INDEX notifications_user_unread ON notifications (user_id) WHERE read_at IS NULL');
}

export async function down({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.dropTable('notifications');
  await q.dropTable('version_comments');
  await q.dropTable('activity');
}
