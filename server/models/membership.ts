import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type CreationOptional, type Sequelize, type ForeignKey, type NonAttribute } from 'sequelize';
import type { Role } from '../../shared/schemas/roles';
import type { Team } from './team';
import type { User } from './user';

/** One person in one team, with that team's role. */
export class Membership extends Model<InferAttributes<Membership>, InferCreationAttributes<Membership>> {
  declare id: CreationOptional<string>;
  declare teamId: ForeignKey<Team['id']>;
  declare userId: ForeignKey<User['id']>;
  declare role: Role;
  declare team?: NonAttribute<Team>;
  declare user?: NonAttribute<User>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initMembership(sequelize: Sequelize): void {
  Membership.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      role: { type: DataTypes.TEXT, allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'memberships' },
  );
}
