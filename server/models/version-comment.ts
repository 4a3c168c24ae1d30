import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type CreationOptional, type Sequelize } from 'sequelize';

/** A comment on a pack version, on the whole version (curveName null) or pinned to a curve at a time. */
export class VersionComment extends Model<InferAttributes<VersionComment>, InferCreationAttributes<VersionComment>> {
  declare id: CreationOptional<string>;
  declare versionId: string;
  declare authorId: string | null;
  declare body: string;
  declare curveName: string | null;
  declare time: number | null;
  declare reviewId: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initVersionComment(sequelize: Sequelize): void {
  VersionComment.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      versionId: { type: DataTypes.UUID, allowNull: false },
      authorId: { type: DataTypes.TEXT, allowNull: true },
      body: { type: DataTypes.TEXT, allowNull: false },
      curveName: { type: DataTypes.TEXT, allowNull: true },
      time: { type: DataTypes.DOUBLE, allowNull: true },
      reviewId: { type: DataTypes.UUID, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'version_comments' },
  );
}
