import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type CreationOptional, type Sequelize, type ForeignKey } from 'sequelize';
import type { Team } from './team';

/** A named read-only token for a build server; only the SHA-256 of its secret is stored. */
export class ServiceToken extends Model<InferAttributes<ServiceToken>, InferCreationAttributes<ServiceToken>> {
  declare id: CreationOptional<string>;
  declare teamId: ForeignKey<Team['id']>;
  declare name: string;
  declare tokenHash: string;
  /** null: every pack of the team. */
  declare packSlugs: string[] | null;
  declare createdBy: string | null;
  declare lastUsedAt: CreationOptional<Date | null>;
  declare revokedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initServiceToken(sequelize: Sequelize): void {
  ServiceToken.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      name: { type: DataTypes.TEXT, allowNull: false },
      tokenHash: { type: DataTypes.TEXT, allowNull: false },
      packSlugs: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: true },
      createdBy: { type: DataTypes.TEXT, allowNull: true },
      lastUsedAt: { type: DataTypes.DATE, allowNull: true },
      revokedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'service_tokens' },
  );
}
