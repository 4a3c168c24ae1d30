import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type CreationOptional, type Sequelize, type ForeignKey } from 'sequelize';
import type { Pack } from './pack';

/** A named pointer of a pack at one of its approved versions. */
export class Channel extends Model<InferAttributes<Channel>, InferCreationAttributes<Channel>> {
  declare id: CreationOptional<string>;
  declare packId: ForeignKey<Pack['id']>;
  declare name: string;
  declare versionId: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

/** One release: the channel moved from one version (null when it was created) to another, by whom, when. */
export class ChannelMove extends Model<InferAttributes<ChannelMove>, InferCreationAttributes<ChannelMove>> {
  declare id: CreationOptional<string>;
  declare channelId: string;
  declare fromVersionId: string | null;
  declare toVersionId: string;
  declare movedBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initChannels(sequelize: Sequelize): void {
  Channel.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      name: { type: DataTypes.TEXT, allowNull: false },
      versionId: { type: DataTypes.UUID, allowNull: false },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'channels' },
  );
  ChannelMove.init(
    {
      id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
      channelId: { type: DataTypes.UUID, allowNull: false },
      fromVersionId: { type: DataTypes.UUID, allowNull: true },
      toVersionId: { type: DataTypes.UUID, allowNull: false },
      movedBy: { type: DataTypes.TEXT, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'channel_moves' },
  );
}
