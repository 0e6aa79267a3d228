// An address (kept only as its keyed hash) that asked for no more "it is live" mail.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';

export class Unsubscribe extends Model<InferAttributes<Unsubscribe>, InferCreationAttributes<Unsubscribe>> {
  declare emailHash: string;
  declare createdAt: CreationOptional<Date>;
}

Unsubscribe.init(
  {
    emailHash: { type: DataTypes.TEXT, primaryKey: true },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'unsubscribes', updatedAt: false },
);
