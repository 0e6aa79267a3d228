// One import of the store's order export: who brought it in, and how many lines it added or skipped.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';

export class SaleImport extends Model<InferAttributes<SaleImport>, InferCreationAttributes<SaleImport>> {
  declare id: CreationOptional<number>;
  declare buildId: number;
  declare userId: number | null;
  declare fileName: string | null;
  declare linesRead: number;
  declare linesAdded: number;
  declare linesSkipped: number;
  declare createdAt: CreationOptional<Date>;
}

SaleImport.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    buildId: { type: DataTypes.INTEGER, allowNull: false },
    userId: DataTypes.INTEGER,
    fileName: DataTypes.TEXT,
    linesRead: { type: DataTypes.INTEGER, allowNull: false },
    linesAdded: { type: DataTypes.INTEGER, allowNull: false },
    linesSkipped: { type: DataTypes.INTEGER, allowNull: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'sale_imports', updatedAt: false },
);
