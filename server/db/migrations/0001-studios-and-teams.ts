import { DataTypes } from 'sequelize';
import type { MigrationContext } from '../migrate';

/** A studio account holds several teams; everything else hangs off a team. */
export async function up({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.createTable('studios', {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    name: { type: DataTypes.TEXT, allowNull: false },
    slug: { type: DataTypes.TEXT, allowNull: false, unique: true },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await q.createTable('teams', {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
    studio_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'studios', key: 'id' }, onDelete: 'CASCADE' },
    name: { type: DataTypes.TEXT, allowNull: false },
    slug: { type: DataTypes.TEXT, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    updated_at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
  });
  await q.addIndex('teams', ['studio_id', 'slug'], { unique: true, name: 'teams_studio_slug_unique' });
}

export async function down({ queryInterface: q }: MigrationContext): Promise<void> {
  await q.dropTable('teams');
  await q.dropTable('studios');
}
