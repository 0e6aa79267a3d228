// One change to the vehicle, with its install and filming state.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';
import type { Area, InstallState, SafetyFlag, SegmentState } from '../../shared/domain';

export class Upgrade extends Model<InferAttributes<Upgrade>, InferCreationAttributes<Upgrade>> {
  declare id: CreationOptional<number>;
  declare buildId: number;
  declare title: string;
  declare replaces: string | null;
  declare becomes: string | null;
  declare area: Area;
  declare estimatedHours: CreationOptional<number>;
  declare valueAddedCents: CreationOptional<number>;
  declare priority: CreationOptional<number>;
  declare safetyFlags: CreationOptional<SafetyFlag[]>;
  declare installState: CreationOptional<InstallState>;
  declare installSegment: CreationOptional<SegmentState>;
  declare demoSegment: CreationOptional<SegmentState>;
  declare installedOn: string | null;
  declare episodeId: number | null;
  declare episodePosition: number | null;
  declare notes: string | null;
  declare tireFrom: string | null;
  declare tireTo: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Upgrade.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    buildId: { type: DataTypes.INTEGER, allowNull: false },
    title: { type: DataTypes.TEXT, allowNull: false },
    replaces: DataTypes.TEXT,
    becomes: DataTypes.TEXT,
    area: { type: DataTypes.TEXT, allowNull: false },
    estimatedHours: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
    valueAddedCents: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    priority: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 3 },
    safetyFlags: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: [] },
    installState: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'queued' },
    installSegment: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'not_shot' },
    demoSegment: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'not_shot' },
    installedOn: DataTypes.DATEONLY,
    episodeId: DataTypes.INTEGER,
    episodePosition: DataTypes.INTEGER,
    notes: DataTypes.TEXT,
    tireFrom: DataTypes.TEXT,
    tireTo: DataTypes.TEXT,
    version: DataTypes.INTEGER,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'upgrades', version: true },
);
