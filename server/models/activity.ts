// The append-only record of who changed what (the database refuses updates and deletes).
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';

export class Activity extends Model<InferAttributes<Activity>, InferCreationAttributes<Activity>> {
  declare id: CreationOptional<number>;
  declare buildId: number | null;
  declare userId: number | null;
  declare userName: string | null;
  declare entity: string;
  declare entityId: number | null;
  declare action: string;
  declare summary: string;
  declare changes: CreationOptional<Record<string, [unknown, unknown]>>;
  declare createdAt: CreationOptional<Date>;
}

Activity.init(
  {
    id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
    buildId: DataTypes.INTEGER,
    userId: DataTypes.INTEGER,
    userName: DataTypes.TEXT,
    entity: { type: DataTypes.TEXT, allowNull: false },
    entityId: DataTypes.INTEGER,
    action: { type: DataTypes.TEXT, allowNull: false },
    summary: { type: DataTypes.TEXT, allowNull: false },
    changes: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'activities', updatedAt: false },
);
