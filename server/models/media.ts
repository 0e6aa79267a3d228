// One photo, video or document in object storage (and its thumbnail), attached to a build and
// optionally to an upgrade, an episode or a part.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize';
import { sequelize } from '../db/sequelize';
import type { MediaKind, MediaStage } from '../../shared/domain';

export class Media extends Model<InferAttributes<Media>, InferCreationAttributes<Media>> {
  declare id: CreationOptional<number>;
  declare buildId: number;
  declare upgradeId: number | null;
  declare episodeId: number | null;
  declare partId: number | null;
  declare kind: MediaKind;
  /** Set at upload for a document on a part; kept when the part goes (money roles only). */
  declare invoice: CreationOptional<boolean>;
  declare stage: MediaStage | null;
  declare caption: string | null;
  declare objectKey: string;
  declare thumbKey: string | null;
  declare originalName: string;
  declare contentType: string;
  declare sizeBytes: number;
  declare sha256: string;
  declare uploadedBy: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Media.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    buildId: { type: DataTypes.INTEGER, allowNull: false },
    upgradeId: DataTypes.INTEGER,
    episodeId: DataTypes.INTEGER,
    partId: DataTypes.INTEGER,
    kind: { type: DataTypes.TEXT, allowNull: false },
    invoice: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    stage: DataTypes.TEXT,
    caption: DataTypes.TEXT,
    objectKey: { type: DataTypes.TEXT, allowNull: false },
    thumbKey: DataTypes.TEXT,
    originalName: { type: DataTypes.TEXT, allowNull: false },
    contentType: { type: DataTypes.TEXT, allowNull: false },
    // BIGINT comes back from pg as a string; a getter keeps it a number (files < 2^53 bytes).
    sizeBytes: {
      type: DataTypes.BIGINT,
      allowNull: false,
      get() {
        return Number(this.getDataValue('sizeBytes'));
      },
    },
    sha256: { type: DataTypes.TEXT, allowNull: false },
    uploadedBy: DataTypes.INTEGER,
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'media' },
);
