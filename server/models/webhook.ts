import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type CreationOptional, type Sequelize, type ForeignKey } from 'sequelize';
import type { Team } from './team';

/** A team's webhook: where to POST which events, signed with `secret` (kept as is: signing needs it; never returned after creation). */
export class Webhook extends Model<InferAttributes<Webhook>, InferCreationAttributes<Webhook>> {
  declare id: CreationOptional<string>;
  declare teamId: ForeignKey<Team['id']>;
  declare url: string;
  declare description: string;
  declare events: string[];
  declare secret: string;
  declare active: CreationOptional<boolean>;
  declare createdBy: string | null;
  declare secretRotatedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initWebhook(sequelize: Sequelize): void {
  Webhook.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      teamId: { type: DataTypes.UUID, allowNull: false },
      url: { type: DataTypes.TEXT, allowNull: false },
      description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      events: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false },
      secret: { type: DataTypes.TEXT, allowNull: false },
      active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
      createdBy: { type: DataTypes.TEXT, allowNull: true },
      secretRotatedAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'webhooks' },
  );
}
