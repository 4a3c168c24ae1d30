import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type CreationOptional, type Sequelize, type ForeignKey } from 'sequelize';
import type { Team } from './team';

export class Pack extends Model<InferAttributes<Pack>, InferCreationAttributes<Pack>> {
  declare id: CreationOptional<string>;
  declare teamId: ForeignKey<Team['id']>;
  declare name: string;
  declare slug: string;
  declare description: CreationOptional<string>;
  declare frameRate: CreationOptional<number>;
  declare tags: CreationOptional<string[]>;
  declare archived: CreationOptional<boolean>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initPack(sequelize: Sequelize): void {
  Pack.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      name: { type: DataTypes.TEXT, allowNull: false },
      slug: { type: DataTypes.TEXT, allowNull: false },
      description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      frameRate: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 60 },
      tags: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
      archived: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'packs' },
  );
}
