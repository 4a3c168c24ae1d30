import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type CreationOptional, type Sequelize, type ForeignKey } from 'sequelize';
import type { Pack } from './pack';
import type { Profile } from '../../shared/bake';
import type { BakeDto, BakeState } from '../../shared/schemas/versions';

/** A proposal being baked in the background (migration 0009); becomes a pack version only when done. */
export class VersionBake extends Model<InferAttributes<VersionBake>, InferCreationAttributes<VersionBake>> {
  declare id: CreationOptional<string>;
  declare packId: ForeignKey<Pack['id']>;
  declare proposedBy: string | null;
  declare changelog: string;
  declare curveCount: number;
  declare sourceKey: string;
  declare sourceSha256: string;
  declare sourceSize: number;
  declare profiles: Profile[];
  declare state: CreationOptional<BakeState>;
  declare progressDone: CreationOptional<number>;
  declare progressTotal: number;
  declare failure: CreationOptional<BakeDto['failure']>;
  declare attempts: CreationOptional<number>;
  declare versionId: CreationOptional<string | null>;
  declare jobId: CreationOptional<string | null>;
  declare startedAt: CreationOptional<Date | null>;
  declare finishedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initVersionBake(sequelize: Sequelize): void {
  VersionBake.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      packId: { type: DataTypes.UUID, allowNull: false },
      proposedBy: { type: DataTypes.TEXT, allowNull: true },
      changelog: { type: DataTypes.TEXT, allowNull: false },
      curveCount: { type: DataTypes.INTEGER, allowNull: false },
      sourceKey: { type: DataTypes.TEXT, allowNull: false },
      sourceSha256: { type: DataTypes.TEXT, allowNull: false },
      sourceSize: { type: DataTypes.INTEGER, allowNull: false },
      profiles: { type: DataTypes.JSONB, allowNull: false },
      state: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'queued' },
      progressDone: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      progressTotal: { type: DataTypes.INTEGER, allowNull: false },
      failure: { type: DataTypes.JSONB, allowNull: true },
      attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      versionId: { type: DataTypes.UUID, allowNull: true },
      jobId: { type: DataTypes.TEXT, allowNull: true },
      startedAt: { type: DataTypes.DATE, allowNull: true },
      finishedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'version_bakes' },
  );
}
