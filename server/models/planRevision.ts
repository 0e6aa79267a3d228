// One applied change of a build's episode plan (or the undo of one), with the plan before and after.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';

/** The plan as far as a revision restores it: episodes in series order, with their dates and upgrades. */
export interface PlanSnapshot {
  episodes: {
    id: number;
    number: number;
    title: string;
    state: string;
    shootDate: string | null;
    releaseDate: string | null;
    upgradeIds: number[];
  }[];
  /** Segments per upgrade when the snapshot was taken, to tell what was filmed since. */
  segments: Record<number, { installSegment: string; demoSegment: string }>;
}

export class PlanRevision extends Model<InferAttributes<PlanRevision>, InferCreationAttributes<PlanRevision>> {
  declare id: CreationOptional<number>;
  declare buildId: number;
  declare number: number;
  declare kind: 'apply' | 'undo';
  declare undoesId: number | null;
  declare undoneAt: CreationOptional<Date | null>;
  declare before: PlanSnapshot;
  declare after: PlanSnapshot;
  declare summary: string;
  declare userId: number | null;
  declare userName: string | null;
  declare createdAt: CreationOptional<Date>;
}

PlanRevision.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    buildId: { type: DataTypes.INTEGER, allowNull: false },
    number: { type: DataTypes.INTEGER, allowNull: false },
    kind: { type: DataTypes.TEXT, allowNull: false },
    undoesId: DataTypes.INTEGER,
    undoneAt: DataTypes.DATE,
    before: { type: DataTypes.JSONB, allowNull: false },
    after: { type: DataTypes.JSONB, allowNull: false },
    summary: { type: DataTypes.TEXT, allowNull: false },
    userId: DataTypes.INTEGER,
    userName: DataTypes.TEXT,
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'plan_revisions', updatedAt: false },
);
