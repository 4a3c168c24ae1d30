import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type CreationOptional, type Sequelize } from 'sequelize';

/** One team event as the activity table keeps it (server/activity/activity.subscriber.ts writes it). */
export class Activity extends Model<InferAttributes<Activity>, InferCreationAttributes<Activity>> {
  /** bigserial, returned by pg as a string. */
  declare id: CreationOptional<string>;
  declare teamId: string;
  declare actorId: string | null;
  declare type: string;
  declare packId: string | null;
  declare packSlug: string | null;
  declare packName: string | null;
  declare subjectKind: string;
  declare subjectId: string | null;
  declare subjectLabel: string;
  declare data: Record<string, unknown>;
  declare at: Date;
}

export function initActivity(sequelize: Sequelize): void {
  Activity.init(
    {
      id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
      teamId: { type: DataTypes.UUID, allowNull: false },
      actorId: { type: DataTypes.TEXT, allowNull: true },
      type: { type: DataTypes.TEXT, allowNull: false },
      packId: { type: DataTypes.UUID, allowNull: true },
      packSlug: { type: DataTypes.TEXT, allowNull: true },
      packName: { type: DataTypes.TEXT, allowNull: true },
      subjectKind: { type: DataTypes.TEXT, allowNull: false },
      subjectId: { type: DataTypes.TEXT, allowNull: true },
      subjectLabel: { type: DataTypes.TEXT, allowNull: false },
      data: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
      at: { type: DataTypes.DATE, allowNull: false },
    },
    { sequelize, tableName: 'activity', timestamps: false },
  );
}
