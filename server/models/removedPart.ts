// A stock part taken off the vehicle, and what became of it (a sale offsets the build's cost).
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';
import type { Disposition } from '../../shared/domain';

export class RemovedPart extends Model<InferAttributes<RemovedPart>, InferCreationAttributes<RemovedPart>> {
  declare id: CreationOptional<number>;
  declare buildId: number;
  declare upgradeId: number | null;
  declare description: string;
  declare partNumber: string | null;
  declare disposition: CreationOptional<Disposition>;
  declare expectedSaleCents: number | null;
  declare actualSaleCents: number | null;
  declare soldOn: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

RemovedPart.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    buildId: { type: DataTypes.INTEGER, allowNull: false },
    upgradeId: DataTypes.INTEGER,
    description: { type: DataTypes.TEXT, allowNull: false },
    partNumber: DataTypes.TEXT,
    disposition: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'keep' },
    expectedSaleCents: DataTypes.INTEGER,
    actualSaleCents: DataTypes.INTEGER,
    soldOn: DataTypes.DATEONLY,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'removed_parts' },
);
