// One person's vote for a viewer request; counted only once confirmed by e-mail.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';

export class ViewerVote extends Model<InferAttributes<ViewerVote>, InferCreationAttributes<ViewerVote>> {
  declare id: CreationOptional<number>;
  declare requestId: number;
  declare emailHash: string;
  declare emailSealed: string | null;
  declare email: CreationOptional<string | null>;
  declare name: string | null;
  declare confirmTokenHash: string;
  declare expiresAt: Date;
  declare confirmedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
}

ViewerVote.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    requestId: { type: DataTypes.INTEGER, allowNull: false },
    emailHash: { type: DataTypes.TEXT, allowNull: false },
    emailSealed: DataTypes.TEXT,
    email: DataTypes.TEXT,
    name: DataTypes.TEXT,
    confirmTokenHash: { type: DataTypes.TEXT, allowNull: false },
    expiresAt: { type: DataTypes.DATE, allowNull: false },
    confirmedAt: DataTypes.DATE,
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'viewer_votes', updatedAt: false },
);
