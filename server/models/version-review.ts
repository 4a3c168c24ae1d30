import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type CreationOptional, type Sequelize, type ForeignKey } from 'sequelize';
import type { PackVersion } from './pack-version';

/** A lead's decision on a pack version, with a comment. */
export class VersionReview extends Model<InferAttributes<VersionReview>, InferCreationAttributes<VersionReview>> {
  declare id: CreationOptional<string>;
  declare versionId: ForeignKey<PackVersion['id']>;
  declare reviewerId: string | null;
  declare decision: 'approve' | 'request-changes';
  declare comment: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initVersionReview(sequelize: Sequelize): void {
  VersionReview.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      reviewerId: { type: DataTypes.TEXT, allowNull: true },
      decision: { type: DataTypes.TEXT, allowNull: false },
      comment: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'version_reviews' },
  );
}
