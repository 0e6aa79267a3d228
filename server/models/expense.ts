// Any other cost of the build (consumables, shipping, filming), optionally on an upgrade.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';

export class Expense extends Model<InferAttributes<Expense>, InferCreationAttributes<Expense>> {
  declare id: CreationOptional<number>;
  declare buildId: number;
  declare upgradeId: number | null;
  declare description: string;
  declare amountCents: number;
  declare spentOn: string;
  declare category: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Expense.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    buildId: { type: DataTypes.INTEGER, allowNull: false },
    upgradeId: DataTypes.INTEGER,
    description: { type: DataTypes.TEXT, allowNull: false },
    amountCents: { type: DataTypes.INTEGER, allowNull: false },
    spentOn: { type: DataTypes.DATEONLY, allowNull: false },
    category: DataTypes.TEXT,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'expenses' },
);
