import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type CreationOptional, type Sequelize, type ForeignKey } from 'sequelize';
import type { Webhook } from './webhook';

export type DeliveryState = 'pending' | 'delivered' | 'failed';

/** One attempt to POST a delivery: when, the answer's status (null when none came), how long it took, what went wrong. */
export interface DeliveryAttempt {
  attempt: number;
  at: string;
  statusCode: number | null;
  responseMs: number;
  error: string | null;
}

/** One event (or ping) to one webhook: the exact body bytes, its state and its attempts. */
export class WebhookDelivery extends Model<InferAttributes<WebhookDelivery>, InferCreationAttributes<WebhookDelivery>> {
  declare id: CreationOptional<string>;
  declare webhookId: ForeignKey<Webhook['id']>;
  declare eventType: string;
  declare eventId: string;
  declare payload: string;
  declare attempts: CreationOptional<number>;
  declare state: CreationOptional<DeliveryState>;
  declare nextAttemptAt: Date | null;
  declare lastStatusCode: CreationOptional<number | null>;
  declare lastResponseMs: CreationOptional<number | null>;
  declare lastError: CreationOptional<string | null>;
  declare attemptLog: CreationOptional<DeliveryAttempt[]>;
  declare redeliveryOf: CreationOptional<string | null>;
  declare deliveredAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initWebhookDelivery(sequelize: Sequelize): void {
  WebhookDelivery.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      webhookId: { type: DataTypes.UUID, allowNull: false },
      eventType: { type: DataTypes.TEXT, allowNull: false },
      eventId: { type: DataTypes.UUID, allowNull: false },
      payload: { type: DataTypes.TEXT, allowNull: false },
      attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      state: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'pending' },
      nextAttemptAt: { type: DataTypes.DATE, allowNull: true },
      lastStatusCode: { type: DataTypes.INTEGER, allowNull: true },
      lastResponseMs: { type: DataTypes.INTEGER, allowNull: true },
      lastError: { type: DataTypes.TEXT, allowNull: true },
      attemptLog: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
      redeliveryOf: { type: DataTypes.UUID, allowNull: true },
      deliveredAt: { type: DataTypes.DATE, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'webhook_deliveries' },
  );
}
