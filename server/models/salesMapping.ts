// The column mapping a build's store export uses, remembered after each import.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';
import type { SalesMapping as Mapping } from '../../shared/schemas/sales';

export class SalesMapping extends Model<InferAttributes<SalesMapping>, InferCreationAttributes<SalesMapping>> {
  declare buildId: number;
  declare mapping: Mapping;
  declare updatedAt: CreationOptional<Date>;
}

SalesMapping.init(
  {
    buildId: { type: DataTypes.INTEGER, primaryKey: true },
    mapping: { type: DataTypes.JSONB, allowNull: false },
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'sales_mappings', createdAt: false },
);
