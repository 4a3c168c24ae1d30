import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type CreationOptional, type Sequelize } from 'sequelize';

/** An in-app notice for one person (server/notifications/notifications.subscriber.ts creates them). */
export class Notification extends Model<InferAttributes<Notification>, InferCreationAttributes<Notification>> {
  declare id: CreationOptional<string>;
  declare userId: string;
  declare type: string;
  declare teamId: string;
  declare packId: string | null;
  declare versionId: string | null;
  declare text: string;
  declare link: string;
  declare readAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initNotification(sequelize: Sequelize): void {
  Notification.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      userId: { type: DataTypes.TEXT, allowNull: false },
      type: { type: DataTypes.TEXT, allowNull: false },
      teamId: { type: DataTypes.UUID, allowNull: false },
      packId: { type: DataTypes.UUID, allowNull: true },
      versionId: { type: DataTypes.UUID, allowNull: true },
      text: { type: DataTypes.TEXT, allowNull: false },
      link: { type: DataTypes.TEXT, allowNull: false },
      readAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'notifications' },
  );
}
