import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type CreationOptional, type Sequelize, type ForeignKey } from 'sequelize';
import type { CurveDocument } from '../../shared/curve';
import type { Pack } from './pack';

export class Curve extends Model<InferAttributes<Curve>, InferCreationAttributes<Curve>> {
  declare id: CreationOptional<string>;
  declare packId: ForeignKey<Pack['id']>;
  /** document.name, kept as a column so it is unique in the pack. */
  declare name: string;
  /** The whole validated curve document (shared/curve/schema.ts). */
  declare document: CurveDocument;
  declare position: CreationOptional<number>;
  declare revision: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initCurve(sequelize: Sequelize): void {
  Curve.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      name: { type: DataTypes.TEXT, allowNull: false },
      document: { type: DataTypes.JSONB, allowNull: false },
      position: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
      revision: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'curves' },
  );
}
