// Hours worked on a build's upgrades. An installer logs, changes and deletes only their own hours;
// the owner and producer may record hours for anyone.
import { sequelize, Build, LabourEntry, User } from '../models';
import { badRequest, forbidden, notFound } from '../errors';
import { diff, record } from './activity';
import { changedFields, requireUpgradeInBuild, toLabourRecord, type Person } from './backlogRecords';
import type { CreateLabourInput, UpdateLabourInput } from '../../shared/schemas/labour';

const managesLabour = (p: Person) => p.roles.some((r) => r === 'owner' || r === 'producer');

export async function listLabour(build: Build, q: { upgradeId?: number }) {
  const where: Record<string, unknown> = { buildId: build.id };
  if (q.upgradeId) where.upgradeId = q.upgradeId;
  const rows = await LabourEntry.findAll({
    where,
    order: [
      ['workedOn', 'DESC'],
      ['id', 'DESC'],
    ],
  });
  return rows.map(toLabourRecord);
}

async function find(buildId: number, id: number, t: import('sequelize').Transaction) {
  const l = await LabourEntry.findOne({ where: { id, buildId }, transaction: t, lock: t.LOCK.UPDATE });
  if (!l) throw notFound('Labour entry');
  return l;
}

/** Whose hours these are: yourself unless you manage labour, in which case any known person. */
async function personFor(
  actor: Person,
  userId: number | null | undefined,
  personName: string | undefined,
  t: import('sequelize').Transaction,
) {
  if (!managesLabour(actor)) {
    if (userId !== undefined && userId !== actor.id) throw forbidden('You may log only your own hours.');
    if (personName !== undefined && personName !== actor.name) throw forbidden('You may log only your own hours.');
    return { userId: actor.id, personName: actor.name };
  }
  if (userId === undefined) return { userId: actor.id, personName: personName ?? actor.name };
  if (userId === null) {
    if (!personName)
      throw badRequest('Check these fields: personName.', [
        { path: 'personName', message: 'is required when the hours are not by a user' },
      ]);
    return { userId: null, personName };
  }
  const u = await User.findByPk(userId, { transaction: t });
  if (!u) throw badRequest('Check these fields: userId.', [{ path: 'userId', message: 'is not a user' }]);
  return { userId: u.id, personName: personName ?? u.name };
}

export async function createLabour(actor: Person, build: Build, input: CreateLabourInput) {
  return sequelize.transaction(async (t) => {
    const u = await requireUpgradeInBuild(build.id, input.upgradeId, 'upgradeId', t);
    const who = await personFor(actor, input.userId, input.personName, t);
    const l = await LabourEntry.create(
      {
        buildId: build.id,
        upgradeId: input.upgradeId,
        ...who,
        workedOn: input.workedOn,
        hours: input.hours,
        kind: input.kind ?? 'install',
        note: input.note ?? null,
      },
      { transaction: t },
    );
    const rec = toLabourRecord(l);
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'labour',
      entityId: l.id,
      action: 'create',
      summary: `${who.personName} logged ${l.hours} h on ${u!.title}`,
      after: rec,
    });
    return rec;
  });
}

export async function updateLabour(actor: Person, build: Build, id: number, input: UpdateLabourInput) {
  return sequelize.transaction(async (t) => {
    const l = await find(build.id, id, t);
    if (!managesLabour(actor) && l.userId !== actor.id) throw forbidden('You may change only your own hours.');
    if (input.upgradeId !== undefined) await requireUpgradeInBuild(build.id, input.upgradeId, 'upgradeId', t);
    const fields: Partial<LabourEntry> = { ...(input as Partial<LabourEntry>) };
    if (input.userId !== undefined || input.personName !== undefined)
      Object.assign(fields, await personFor(actor, input.userId, input.personName, t));
    const before = toLabourRecord(l);
    l.set(fields);
    await l.save({ transaction: t });
    const after = toLabourRecord(l);
    const changes = diff(before, after);
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'labour',
      entityId: l.id,
      action: 'update',
      summary: `Changed hours of ${l.personName}: ${changedFields(changes)}`,
      changes,
    });
    return after;
  });
}

export async function deleteLabour(actor: Person, build: Build, id: number) {
  await sequelize.transaction(async (t) => {
    const l = await find(build.id, id, t);
    if (!managesLabour(actor) && l.userId !== actor.id) throw forbidden('You may delete only your own hours.');
    const before = toLabourRecord(l);
    await l.destroy({ transaction: t });
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'labour',
      entityId: l.id,
      action: 'delete',
      summary: `Deleted ${l.hours} h of ${l.personName}`,
      before,
    });
  });
}
