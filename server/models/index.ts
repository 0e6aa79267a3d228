// Every model, and the associations between them, wired in one place.
import { sequelize } from '../db/sequelize';
import { User } from './user';
import { Build } from './build';
import { Upgrade } from './upgrade';
import { UpgradePrerequisite } from './upgradePrerequisite';
import { Part } from './part';
import { RemovedPart } from './removedPart';
import { LabourEntry } from './labourEntry';
import { Expense } from './expense';
import { Episode } from './episode';
import { EpisodeChapter } from './episodeChapter';
import { Activity } from './activity';
import { ViewerRequest } from './viewerRequest';
import { ViewerVote } from './viewerVote';
import { MailOutbox } from './mailOutbox';
import { Unsubscribe } from './unsubscribe';
import { Media } from './media';
import { PlanRevision } from './planRevision';
export { SaleLine, SaleImport, SalesMapping } from './saleModels';

Build.hasMany(Upgrade, { foreignKey: 'buildId', as: 'upgrades' });
Upgrade.belongsTo(Build, { foreignKey: 'buildId', as: 'build' });
Upgrade.hasMany(Part, { foreignKey: 'upgradeId', as: 'parts' });
Part.belongsTo(Upgrade, { foreignKey: 'upgradeId', as: 'upgrade' });
Upgrade.hasMany(RemovedPart, { foreignKey: 'upgradeId', as: 'removedParts' });
Upgrade.hasMany(LabourEntry, { foreignKey: 'upgradeId', as: 'labour' });
Upgrade.hasMany(Expense, { foreignKey: 'upgradeId', as: 'expenses' });
Upgrade.hasMany(UpgradePrerequisite, { foreignKey: 'upgradeId', as: 'prerequisiteLinks' });
Build.hasMany(Episode, { foreignKey: 'buildId', as: 'episodes' });
Episode.hasMany(Upgrade, { foreignKey: 'episodeId', as: 'upgrades' });
Upgrade.belongsTo(Episode, { foreignKey: 'episodeId', as: 'episode' });
Episode.hasMany(EpisodeChapter, { foreignKey: 'episodeId', as: 'chapters' });
LabourEntry.belongsTo(User, { foreignKey: 'userId', as: 'user' });
Media.belongsTo(User, { foreignKey: 'uploadedBy', as: 'uploader' });

export {
  sequelize,
  User,
  Build,
  Upgrade,
  UpgradePrerequisite,
  Part,
  RemovedPart,
  LabourEntry,
  Expense,
  Episode,
  EpisodeChapter,
  Activity,
  ViewerRequest,
  ViewerVote,
  MailOutbox,
  Unsubscribe,
  Media,
  PlanRevision,
};
