// A part line on an upgrade: what to buy, what it cost, when it comes, where it is.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';
import type { PartCondition, PartState } from '../../shared/domain';

export class Part extends Model<InferAttributes<Part>, InferCreationAttributes<Part>> {
  declare id: CreationOptional<number>;
  declare buildId: number;
  declare upgradeId: number;
  declare partNumber: string;
  declare description: string;
  declare quantity: CreationOptional<number>;
  declare unitCostCents: CreationOptional<number>;
  declare retailPriceCents: number | null;
  declare supplier: string | null;
  declare condition: CreationOptional<PartCondition>;
  declare productUrl: string | null;
  declare expectedArrival: string | null;
  declare orderedOn: string | null;
  declare receivedOn: string | null;
  declare state: CreationOptional<PartState>;
  declare storeSku: CreationOptional<string | null>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Part.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    buildId: { type: DataTypes.INTEGER, allowNull: false },
    upgradeId: { type: DataTypes.INTEGER, allowNull: false },
    partNumber: { type: DataTypes.TEXT, allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: false },
    quantity: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    unitCostCents: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    retailPriceCents: DataTypes.INTEGER,
    supplier: DataTypes.TEXT,
    condition: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'new' },
    productUrl: DataTypes.TEXT,
    expectedArrival: DataTypes.DATEONLY,
    orderedOn: DataTypes.DATEONLY,
    receivedOn: DataTypes.DATEONLY,
    state: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'to_order' },
    storeSku: { type: DataTypes.TEXT, allowNull: true },
    version: DataTypes.INTEGER,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'parts', version: true },
);
