import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type CreationOptional, type Sequelize, type ForeignKey } from 'sequelize';
import type { PackVersion } from './pack-version';

/** One stored object of a version: its source, or one output of one target profile. */
export class VersionArtifact extends Model<InferAttributes<VersionArtifact>, InferCreationAttributes<VersionArtifact>> {
  declare id: CreationOptional<string>;
  declare versionId: ForeignKey<PackVersion['id']>;
  declare position: number;
  declare profileName: string | null;
  declare format: string;
  declare fileName: string;
  declare mediaType: string;
  declare key: string;
  declare sha256: string;
  declare size: number;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initVersionArtifact(sequelize: Sequelize): void {
  VersionArtifact.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      position: { type: DataTypes.INTEGER, allowNull: false },
      profileName: { type: DataTypes.TEXT, allowNull: true },
      format: { type: DataTypes.TEXT, allowNull: false },
      fileName: { type: DataTypes.TEXT, allowNull: false },
      mediaType: { type: DataTypes.TEXT, allowNull: false },
      key: { type: DataTypes.TEXT, allowNull: false },
      sha256: { type: DataTypes.TEXT, allowNull: false },
      size: { type: DataTypes.INTEGER, allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'version_artifacts' },
  );
}
