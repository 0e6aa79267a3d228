// Hours worked by a person on an upgrade on a date.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';
import type { LabourKind } from '../../shared/domain';

export class LabourEntry extends Model<InferAttributes<LabourEntry>, InferCreationAttributes<LabourEntry>> {
  declare id: CreationOptional<number>;
  declare buildId: number;
  declare upgradeId: number;
  declare userId: number | null;
  declare personName: string;
  declare workedOn: string;
  declare hours: number;
  declare kind: CreationOptional<LabourKind>;
  declare note: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

LabourEntry.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    buildId: { type: DataTypes.INTEGER, allowNull: false },
    upgradeId: { type: DataTypes.INTEGER, allowNull: false },
    userId: DataTypes.INTEGER,
    personName: { type: DataTypes.TEXT, allowNull: false },
    workedOn: { type: DataTypes.DATEONLY, allowNull: false },
    hours: { type: DataTypes.DOUBLE, allowNull: false },
    kind: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'install' },
    note: DataTypes.TEXT,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'labour_entries' },
);
