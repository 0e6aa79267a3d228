// One demo vehicle and its series.
import { randomBytes } from 'node:crypto';
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';

/** 192 random bits, hex: the secret part of the build's calendar feed URL. */
export const newCalendarToken = () => randomBytes(24).toString('hex');

export class Build extends Model<InferAttributes<Build>, InferCreationAttributes<Build>> {
  declare id: CreationOptional<number>;
  declare slug: string;
  declare name: string;
  declare year: number;
  declare make: string;
  declare model: string;
  declare trim: CreationOptional<string>;
  declare vin: string | null;
  declare vinCheckOverridden: CreationOptional<boolean>;
  declare mileage: number | null;
  declare budgetCents: number | null;
  declare labourRateCents: number | null;
  declare shopHoursPerWeek: CreationOptional<number>;
  declare shootHoursPerEpisode: CreationOptional<number>;
  declare releaseCadenceDays: CreationOptional<number>;
  declare startDate: CreationOptional<string>;
  declare isPublic: CreationOptional<boolean>;
  declare campaign: string | null;
  declare summary: string | null;
  declare calendarToken: CreationOptional<string>;
  declare timeZone: CreationOptional<string>;
  declare costRecognition: CreationOptional<'fitting' | 'receipt'>;
  declare currency: CreationOptional<string>;
  declare attributionWindowDays: CreationOptional<number>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Build.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    slug: { type: DataTypes.TEXT, allowNull: false },
    name: { type: DataTypes.TEXT, allowNull: false },
    year: { type: DataTypes.INTEGER, allowNull: false },
    make: { type: DataTypes.TEXT, allowNull: false },
    model: { type: DataTypes.TEXT, allowNull: false },
    trim: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    vin: { type: DataTypes.TEXT, allowNull: true },
    vinCheckOverridden: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    mileage: { type: DataTypes.INTEGER, allowNull: true },
    budgetCents: { type: DataTypes.INTEGER, allowNull: true },
    labourRateCents: { type: DataTypes.INTEGER, allowNull: true },
    shopHoursPerWeek: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 20 },
    shootHoursPerEpisode: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 8 },
    releaseCadenceDays: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 7 },
    startDate: { type: DataTypes.DATEONLY, allowNull: false, defaultValue: DataTypes.NOW },
    isPublic: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    campaign: { type: DataTypes.TEXT, allowNull: true },
    summary: { type: DataTypes.TEXT, allowNull: true },
    calendarToken: { type: DataTypes.TEXT, allowNull: false, defaultValue: newCalendarToken },
    timeZone: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'UTC' },
    costRecognition: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'fitting' },
    currency: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'USD' },
    attributionWindowDays: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 30 },
    version: DataTypes.INTEGER,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'builds', version: true },
);
