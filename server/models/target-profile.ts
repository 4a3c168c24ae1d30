import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type CreationOptional, type Sequelize, type ForeignKey } from 'sequelize';
import type { Profile } from '../../shared/bake/profile';
import type { Team } from './team';

export class TargetProfile extends Model<InferAttributes<TargetProfile>, InferCreationAttributes<TargetProfile>> {
  declare id: CreationOptional<string>;
  declare teamId: ForeignKey<Team['id']>;
  declare name: string;
  /** The whole validated profile (shared/bake/profile.ts), name included. */
  declare spec: Profile;
  declare position: CreationOptional<number>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initTargetProfile(sequelize: Sequelize): void {
  TargetProfile.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      name: { type: DataTypes.TEXT, allowNull: false },
      spec: { type: DataTypes.JSONB, allowNull: false },
      position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'target_profiles' },
  );
}
