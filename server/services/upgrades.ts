// The backlog: upgrades of a build with filters, sorting and paging; create, update (optimistic lock,
// installer limited to install and filming state), prerequisites without cycles, delete, history.
import { Op, QueryTypes, literal, type Order, type Transaction, type WhereOptions } from 'sequelize';
import {
  sequelize,
  Activity,
  Build,
  Episode,
  Expense,
  LabourEntry,
  Part,
  RemovedPart,
  Upgrade,
  UpgradePrerequisite,
} from '../models';
import { AppError, badRequest, forbidden } from '../errors';
import { record, diff } from './activity';
import { seesMoney } from './visibility';
import { Upgrade as UpgradeContract } from '../../shared/contracts/upgrade';
import {
  activityView,
  changedFields,
  findUpgrade,
  prerequisiteMap,
  stale,
  toExpenseRecord,
  toLabourRecord,
  toPartRecord,
  toRemovedPartRecord,
  toUpgradeRecord,
  upgradeRecord,
  type Person,
} from './backlogRecords';
import { findCycle } from '../../shared/planner/criticalPath';
import { checkMarks, partWords } from './upgradeMarks';
import { cautionsFor } from '../../shared/safety';
import {
  INSTALLER_UPGRADE_FIELDS,
  type CreateUpgradeInput,
  type UpdateUpgradeInput,
  type UpgradeListQuery,
} from '../../shared/schemas/upgrade';
import { todayIn } from '../../shared/dates';

const isInstallerOnly = (p: Person) => !p.roles.some((r) => r === 'owner' || r === 'producer');

const SORT_COLUMNS: Record<UpgradeListQuery['sort'], string> = {
  title: 'title',
  area: 'area',
  priority: 'priority',
  estimatedHours: 'estimatedHours',
  installState: 'installState',
  episode: 'episode',
};

/** A page of the backlog, every field: the route sends each person's allow-list of them (shared/contracts/upgrade.ts). */
export async function listUpgrades(build: Build, q: UpgradeListQuery) {
  const where: WhereOptions<Upgrade> & Record<string | symbol, unknown> = { buildId: build.id };
  if (q.area) where.area = q.area;
  if (q.installState) where.installState = q.installState;
  if (q.episodeId === 'none') where.episodeId = null;
  else if (q.episodeId !== undefined) where.episodeId = q.episodeId;
  if (q.safetyFlag) where.safetyFlags = { [Op.contains]: [q.safetyFlag] };
  if (q.q) {
    const like = `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    where[Op.or] = ['title', 'replaces', 'becomes', 'notes'].map((f) => ({ [f]: { [Op.iLike]: like } }));
  }
  const dir = q.dir === 'desc' ? 'DESC' : 'ASC';
  const order: Order =
    q.sort === 'episode'
      ? [
          [literal(`(SELECT e.number FROM episodes e WHERE e.id = "Upgrade"."episode_id")`), `${dir} NULLS LAST`],
          ['episodePosition', `${dir} NULLS LAST`],
          ['id', 'ASC'],
        ]
      : [
          [SORT_COLUMNS[q.sort], dir],
          ['id', 'ASC'],
        ];
  const { rows, count } = await Upgrade.findAndCountAll({
    where,
    order,
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
  });
  const map = await prerequisiteMap(
    build.id,
    undefined,
    rows.map((r) => r.id),
  );
  return {
    upgrades: rows.map((u) => toUpgradeRecord(u, map.get(u.id) ?? [])),
    total: count,
    page: q.page,
    pageSize: q.pageSize,
  };
}

export async function getUpgradeDetail(build: Build, id: number, viewer: Person) {
  const u = await findUpgrade(build.id, id);
  const where = { buildId: build.id, upgradeId: u.id };
  const [parts, removedParts, labour, expenses] = await Promise.all([
    Part.findAll({ where, order: [['id', 'ASC']] }),
    RemovedPart.findAll({ where, order: [['id', 'ASC']] }),
    LabourEntry.findAll({
      where,
      order: [
        ['workedOn', 'DESC'],
        ['id', 'DESC'],
      ],
    }),
    seesMoney(viewer)
      ? Expense.findAll({
          where,
          order: [
            ['spentOn', 'DESC'],
            ['id', 'DESC'],
          ],
        })
      : Promise.resolve(null),
  ]);
  return {
    upgrade: await upgradeRecord(u),
    // The safety cautions of its flags, in our own words (shared/safety.ts), for the drawer to show.
    cautions: cautionsFor(u.safetyFlags),
    parts: parts.map(toPartRecord),
    removedParts: removedParts.map(toRemovedPartRecord),
    labour: labour.map(toLabourRecord),
    // Expenses are money through and through: not read for roles that may not see money, and
    // their contract (UpgradeDetail.crew) has no list to send.
    expenses: (expenses ?? []).map((e) => toExpenseRecord(e)),
  };
}

async function requireEpisodeInBuild(buildId: number, episodeId: number | null | undefined, t: Transaction) {
  if (episodeId === null || episodeId === undefined) return;
  const ep = await Episode.findOne({ where: { id: episodeId, buildId }, transaction: t });
  if (!ep)
    throw badRequest('Check these fields: episodeId.', [
      { path: 'episodeId', message: 'is not an episode of this build' },
    ]);
}

async function requirePrerequisitesInBuild(buildId: number, ids: number[], t: Transaction) {
  const unique = [...new Set(ids)];
  if (!unique.length) return unique;
  const found = await Upgrade.count({ where: { buildId, id: { [Op.in]: unique } }, transaction: t });
  if (found !== unique.length) {
    throw badRequest('Check these fields: prerequisiteIds.', [
      { path: 'prerequisiteIds', message: 'names an upgrade that is not in this build' },
    ]);
  }
  return unique;
}

export async function createUpgrade(actor: Person, build: Build, input: CreateUpgradeInput) {
  return sequelize.transaction(async (t) => {
    const { prerequisiteIds = [], ...fields } = input;
    await requireEpisodeInBuild(build.id, fields.episodeId, t);
    const prereqs = await requirePrerequisitesInBuild(build.id, prerequisiteIds, t);
    if (fields.installState === 'installed' && !fields.installedOn) fields.installedOn = todayIn(build.timeZone);
    const u = await Upgrade.create({ ...(fields as Required<typeof fields>), buildId: build.id }, { transaction: t });
    await u.reload({ transaction: t }); // version and database defaults
    // A new upgrade has no dependants yet, so its prerequisites cannot close a cycle.
    if (prereqs.length)
      await UpgradePrerequisite.bulkCreate(
        prereqs.map((p) => ({ buildId: build.id, upgradeId: u.id, prerequisiteId: p })),
        { transaction: t },
      );
    const rec = toUpgradeRecord(u, prereqs);
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'upgrade',
      entityId: u.id,
      action: 'create',
      summary: `Added upgrade ${u.title}`,
      after: rec,
    });
    return rec;
  });
}

/** Titles of the prerequisites of `u` that are not installed yet. */
async function uninstalledPrerequisites(u: Upgrade, t: Transaction) {
  const rows = await sequelize.query<{ title: string }>(
    `SELECT p.title FROM upgrade_prerequisites l JOIN upgrades p ON p.id = l.prerequisite_id
      WHERE l.upgrade_id = :id AND l.build_id = :b AND p.install_state <> 'installed' ORDER BY p.title`,
    { replacements: { id: u.id, b: u.buildId }, transaction: t, type: QueryTypes.SELECT },
  );
  return rows.map((r) => r.title);
}

export async function updateUpgrade(actor: Person, build: Build, id: number, input: UpdateUpgradeInput) {
  if (isInstallerOnly(actor)) {
    const refused = Object.keys(input).filter((k) => !(INSTALLER_UPGRADE_FIELDS as readonly string[]).includes(k));
    if (refused.length)
      throw forbidden(`An installer may change only install and filming state (not ${refused.join(', ')}).`);
  }
  return sequelize.transaction(async (t) => {
    const u = await findUpgrade(build.id, id, t, true);
    if (u.version !== input.version) throw stale(await upgradeRecord(u, t), actor, UpgradeContract);
    const { version: _v, confirmPartsNotReceived, ...fields } = input;
    await requireEpisodeInBuild(build.id, fields.episodeId, t);
    const notReceived = await checkMarks(u, fields, confirmPartsNotReceived, t);
    const entering = fields.installState && fields.installState !== u.installState && fields.installState !== 'queued';
    if (entering && isInstallerOnly(actor)) {
      const missing = await uninstalledPrerequisites(u, t);
      if (missing.length) {
        throw new AppError(
          409,
          'prerequisites_not_installed',
          `Install these first: ${missing.join(', ')}.`,
          undefined,
          { prerequisites: missing },
        );
      }
    }
    if (fields.installedOn === undefined && fields.installState && fields.installState !== u.installState) {
      // The install date follows the state unless the person gives one: set on install, cleared on the way back.
      if (fields.installState === 'installed' && !u.installedOn) fields.installedOn = todayIn(build.timeZone);
      if (fields.installState !== 'installed') fields.installedOn = null;
    }
    const before = await upgradeRecord(u, t);
    u.set(fields as Partial<Upgrade>);
    // A position belongs to the episode it was given in; a move to another episode goes to its end.
    if (fields.episodeId !== undefined && fields.episodeId !== before.episodeId) u.episodePosition = null;
    await u.save({ transaction: t });
    const after = await upgradeRecord(u, t);
    const changes = diff(before, after);
    const goingAhead = notReceived.length
      ? ` — marked installed with parts not received: ${notReceived.map(partWords).join('; ')}`
      : '';
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'upgrade',
      entityId: u.id,
      action: 'update',
      summary: `Changed ${u.title}: ${changedFields(changes)}${goingAhead}`,
      changes,
    });
    return after;
  });
}

export async function setPrerequisites(actor: Person, build: Build, id: number, prerequisiteIds: number[]) {
  return sequelize.transaction(async (t) => {
    // Serialise prerequisite edits per build so two edits cannot together close a cycle.
    await Build.findByPk(build.id, { transaction: t, lock: t.LOCK.UPDATE });
    const u = await findUpgrade(build.id, id, t, true);
    if (prerequisiteIds.includes(u.id)) {
      throw badRequest('Check these fields: prerequisiteIds.', [
        { path: 'prerequisiteIds', message: 'an upgrade cannot need itself' },
      ]);
    }
    const wanted = await requirePrerequisitesInBuild(build.id, prerequisiteIds, t);
    const all = await Upgrade.findAll({ where: { buildId: build.id }, attributes: ['id', 'title'], transaction: t });
    const links = await UpgradePrerequisite.findAll({ where: { buildId: build.id }, transaction: t });
    const edges: [number, number][] = links
      .filter((l) => l.upgradeId !== u.id)
      .map((l) => [l.prerequisiteId, l.upgradeId]);
    for (const p of wanted) edges.push([p, u.id]);
    const cycle = findCycle(
      all.map((x) => x.id),
      edges,
    );
    if (cycle) {
      const titles = new Map(all.map((x) => [x.id, x.title]));
      const names = cycle.map((c) => titles.get(c) ?? String(c));
      throw new AppError(422, 'cycle', `That would make a loop: ${[...names, names[0]].join(' → ')}.`, undefined, {
        cycle: names,
      });
    }
    const before = links
      .filter((l) => l.upgradeId === u.id)
      .map((l) => l.prerequisiteId)
      .sort((a, b) => a - b);
    await UpgradePrerequisite.destroy({ where: { buildId: build.id, upgradeId: u.id }, transaction: t });
    if (wanted.length)
      await UpgradePrerequisite.bulkCreate(
        wanted.map((p) => ({ buildId: build.id, upgradeId: u.id, prerequisiteId: p })),
        { transaction: t },
      );
    const after = [...wanted].sort((a, b) => a - b);
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'upgrade',
      entityId: u.id,
      action: 'prerequisites',
      summary: `Set what ${u.title} needs first (${after.length})`,
      changes: { prerequisiteIds: [before, after] },
    });
    return toUpgradeRecord(u, after);
  });
}

export async function deleteUpgrade(actor: Person, build: Build, id: number) {
  await sequelize.transaction(async (t) => {
    const u = await findUpgrade(build.id, id, t, true);
    const dependants = await sequelize.query<{ title: string }>(
      `SELECT d.title FROM upgrade_prerequisites l JOIN upgrades d ON d.id = l.upgrade_id WHERE l.prerequisite_id = :id AND l.build_id = :b ORDER BY d.title`,
      { replacements: { id: u.id, b: build.id }, transaction: t, type: QueryTypes.SELECT },
    );
    const names = dependants.map((d) => d.title);
    if (names.length) {
      throw new AppError(
        409,
        'has_dependants',
        `Other upgrades need ${u.title} first: ${names.join(', ')}. Remove it from their prerequisites first.`,
        undefined,
        { dependants: names },
      );
    }
    const before = await upgradeRecord(u, t);
    await u.destroy({ transaction: t });
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'upgrade',
      entityId: u.id,
      action: 'delete',
      summary: `Deleted upgrade ${u.title}`,
      before,
    });
  });
}

/** The history of one upgrade and of the parts, removed parts, labour and expenses on it, newest first. */
export async function upgradeActivity(build: Build, id: number, viewer: Person) {
  const u = await findUpgrade(build.id, id);
  const where = { buildId: build.id, upgradeId: u.id };
  const ids = (rows: { id: number }[]) => rows.map((r) => r.id);
  const [parts, removed, labour, expenses] = await Promise.all([
    Part.findAll({ where, attributes: ['id'] }).then(ids),
    RemovedPart.findAll({ where, attributes: ['id'] }).then(ids),
    LabourEntry.findAll({ where, attributes: ['id'] }).then(ids),
    Expense.findAll({ where, attributes: ['id'] }).then(ids),
  ]);
  const or: WhereOptions[] = [{ entity: 'upgrade', entityId: u.id }];
  if (parts.length) or.push({ entity: 'part', entityId: { [Op.in]: parts } });
  if (removed.length) or.push({ entity: 'removed_part', entityId: { [Op.in]: removed } });
  if (labour.length) or.push({ entity: 'labour', entityId: { [Op.in]: labour } });
  if (expenses.length && seesMoney(viewer)) or.push({ entity: 'expense', entityId: { [Op.in]: expenses } });
  const rows = await Activity.findAll({
    where: { buildId: build.id, [Op.or]: or },
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC'],
    ],
    limit: 500,
  });
  return activityView(rows, viewer);
}
