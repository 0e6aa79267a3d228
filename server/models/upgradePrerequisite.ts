// An edge "upgrade needs prerequisite first", always inside one build.
import { DataTypes, Model, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';

export class UpgradePrerequisite extends Model<
  InferAttributes<UpgradePrerequisite>,
  InferCreationAttributes<UpgradePrerequisite>
> {
  declare buildId: number;
  declare upgradeId: number;
  declare prerequisiteId: number;
}

UpgradePrerequisite.init(
  {
    buildId: { type: DataTypes.INTEGER, allowNull: false },
    upgradeId: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true },
    prerequisiteId: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true },
  },
  { sequelize, tableName: 'upgrade_prerequisites', timestamps: false },
);
