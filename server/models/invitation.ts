import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type CreationOptional, type Sequelize, type ForeignKey, type NonAttribute } from 'sequelize';
import type { Role } from '../../shared/schemas/roles';
import type { Team } from './team';

/** An e-mail invitation into a team; only the SHA-256 of its link secret is stored. */
export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<string>;
  declare teamId: ForeignKey<Team['id']>;
  declare email: string;
  declare role: Role;
  declare tokenHash: string;
  declare invitedBy: string | null;
  declare expiresAt: Date;
  declare acceptedAt: CreationOptional<Date | null>;
  declare team?: NonAttribute<Team>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initInvitation(sequelize: Sequelize): void {
  Invitation.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      email: { type: DataTypes.TEXT, allowNull: false },
      role: { type: DataTypes.TEXT, allowNull: false },
      tokenHash: { type: DataTypes.TEXT, allowNull: false },
      invitedBy: { type: DataTypes.TEXT, allowNull: true },
      expiresAt: { type: DataTypes.DATE, allowNull: false },
      acceptedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'invitations' },
  );
}
