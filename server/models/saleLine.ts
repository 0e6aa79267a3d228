// One order line from the store's export (a sale, or a refund with quantity and revenue below zero).
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';

export class SaleLine extends Model<InferAttributes<SaleLine>, InferCreationAttributes<SaleLine>> {
  declare id: CreationOptional<number>;
  declare buildId: number;
  declare importId: number | null;
  declare orderId: string;
  declare lineId: string | null;
  declare soldOn: string;
  declare sku: string;
  declare quantity: number;
  declare revenueCents: number;
  declare currency: string;
  declare campaign: string | null;
  declare content: string | null;
  declare createdAt: CreationOptional<Date>;
}

SaleLine.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    buildId: { type: DataTypes.INTEGER, allowNull: false },
    importId: DataTypes.INTEGER,
    orderId: { type: DataTypes.TEXT, allowNull: false },
    lineId: DataTypes.TEXT,
    soldOn: { type: DataTypes.DATEONLY, allowNull: false },
    sku: { type: DataTypes.TEXT, allowNull: false },
    quantity: { type: DataTypes.INTEGER, allowNull: false },
    revenueCents: { type: DataTypes.INTEGER, allowNull: false },
    currency: { type: DataTypes.TEXT, allowNull: false },
    campaign: DataTypes.TEXT,
    content: DataTypes.TEXT,
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'sale_lines', updatedAt: false },
);
