// A chapter mark in an episode's description: a start time, a title, optionally an upgrade.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';

export class EpisodeChapter extends Model<InferAttributes<EpisodeChapter>, InferCreationAttributes<EpisodeChapter>> {
  declare id: CreationOptional<number>;
  declare episodeId: number;
  declare position: number;
  declare startSeconds: number;
  declare title: string;
  declare upgradeId: number | null;
}

EpisodeChapter.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    episodeId: { type: DataTypes.INTEGER, allowNull: false },
    position: { type: DataTypes.INTEGER, allowNull: false },
    startSeconds: { type: DataTypes.INTEGER, allowNull: false },
    title: { type: DataTypes.TEXT, allowNull: false },
    upgradeId: DataTypes.INTEGER,
  },
  { sequelize, tableName: 'episode_chapters', timestamps: false },
);
