// One episode of the series: its upgrades in order, its state and dates.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';
import type { EpisodeState } from '../../shared/domain';

export class Episode extends Model<InferAttributes<Episode>, InferCreationAttributes<Episode>> {
  declare id: CreationOptional<number>;
  declare buildId: number;
  declare number: number;
  declare title: string;
  declare summary: string | null;
  declare state: CreationOptional<EpisodeState>;
  declare shootDate: string | null;
  declare releaseDate: string | null;
  declare videoUrl: string | null;
  declare runtimeSeconds: number | null;
  declare publishedAt: Date | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Episode.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    buildId: { type: DataTypes.INTEGER, allowNull: false },
    number: { type: DataTypes.INTEGER, allowNull: false },
    title: { type: DataTypes.TEXT, allowNull: false },
    summary: DataTypes.TEXT,
    state: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'draft' },
    shootDate: DataTypes.DATEONLY,
    releaseDate: DataTypes.DATEONLY,
    videoUrl: DataTypes.TEXT,
    runtimeSeconds: DataTypes.INTEGER,
    publishedAt: DataTypes.DATE,
    version: DataTypes.INTEGER,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'episodes', version: true },
);
