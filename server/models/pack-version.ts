import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type CreationOptional, type Sequelize, type ForeignKey } from 'sequelize';
import type { Pack } from './pack';
import type { BakeSummary } from '../../shared/schemas/versions';

/** A pack version's manifest row (immutable once inserted, apart from its review state). */
export class PackVersion extends Model<InferAttributes<PackVersion>, InferCreationAttributes<PackVersion>> {
  declare id: CreationOptional<string>;
  declare packId: ForeignKey<Pack['id']>;
  declare number: number;
  declare changelog: string;
  declare state: CreationOptional<string>;
  declare proposedBy: string | null;
  declare curveCount: number;
  declare sourceKey: string;
  declare sourceSha256: string;
  declare sourceSize: number;
  declare bakeSummary: BakeSummary[];
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initPackVersion(sequelize: Sequelize): void {
  PackVersion.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      number: { type: DataTypes.INTEGER, allowNull: false },
      changelog: { type: DataTypes.TEXT, allowNull: false },
      state: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'proposed' },
      proposedBy: { type: DataTypes.TEXT, allowNull: true },
      curveCount: { type: DataTypes.INTEGER, allowNull: false },
      sourceKey: { type: DataTypes.TEXT, allowNull: false },
      sourceSha256: { type: DataTypes.TEXT, allowNull: false },
      sourceSize: { type: DataTypes.INTEGER, allowNull: false },
      bakeSummary: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'pack_versions' },
  );
}
