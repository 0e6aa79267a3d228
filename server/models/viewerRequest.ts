// A viewer's public request for an upgrade; its confirmed votes say how many want it.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';
import type { RequestState } from '../../shared/domain';

export class ViewerRequest extends Model<InferAttributes<ViewerRequest>, InferCreationAttributes<ViewerRequest>> {
  declare id: CreationOptional<number>;
  declare buildId: number;
  declare title: string;
  declare details: string | null;
  declare state: CreationOptional<RequestState>;
  declare upgradeId: CreationOptional<number | null>;
  declare mergedIntoId: CreationOptional<number | null>;
  declare declineReason: CreationOptional<string | null>;
  declare confirmedAt: CreationOptional<Date | null>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

ViewerRequest.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    buildId: { type: DataTypes.INTEGER, allowNull: false },
    title: { type: DataTypes.TEXT, allowNull: false },
    details: DataTypes.TEXT,
    state: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'new' },
    upgradeId: DataTypes.INTEGER,
    mergedIntoId: DataTypes.INTEGER,
    declineReason: DataTypes.TEXT,
    confirmedAt: DataTypes.DATE,
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'viewer_requests', version: true },
);
