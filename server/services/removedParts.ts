// Stock parts taken off the vehicle and what became of them; a sale offsets the build's cost.
import { sequelize, Build, RemovedPart } from '../models';
import { notFound } from '../errors';
import { diff, record } from './activity';
import { changedFields, requireUpgradeInBuild, toRemovedPartRecord, type Person } from './backlogRecords';
import type { CreateRemovedPartInput, UpdateRemovedPartInput } from '../../shared/schemas/removedPart';

export async function listRemovedParts(build: Build, q: { upgradeId?: number }) {
  const where: Record<string, unknown> = { buildId: build.id };
  if (q.upgradeId) where.upgradeId = q.upgradeId;
  const rows = await RemovedPart.findAll({ where, order: [['id', 'ASC']] });
  return rows.map(toRemovedPartRecord);
}

async function find(buildId: number, id: number, t: import('sequelize').Transaction) {
  const r = await RemovedPart.findOne({ where: { id, buildId }, transaction: t, lock: t.LOCK.UPDATE });
  if (!r) throw notFound('Removed part');
  return r;
}

export async function createRemovedPart(actor: Person, build: Build, input: CreateRemovedPartInput) {
  return sequelize.transaction(async (t) => {
    await requireUpgradeInBuild(build.id, input.upgradeId, 'upgradeId', t);
    const r = await RemovedPart.create(
      { ...(input as Required<CreateRemovedPartInput>), upgradeId: input.upgradeId ?? null, buildId: build.id },
      { transaction: t },
    );
    const rec = toRemovedPartRecord(r);
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'removed_part',
      entityId: r.id,
      action: 'create',
      summary: `Recorded removed part ${r.description}`,
      after: rec,
    });
    return rec;
  });
}

export async function updateRemovedPart(actor: Person, build: Build, id: number, input: UpdateRemovedPartInput) {
  return sequelize.transaction(async (t) => {
    const r = await find(build.id, id, t);
    if (input.upgradeId !== undefined) await requireUpgradeInBuild(build.id, input.upgradeId, 'upgradeId', t);
    const before = toRemovedPartRecord(r);
    r.set(input as Partial<RemovedPart>);
    await r.save({ transaction: t });
    const after = toRemovedPartRecord(r);
    const changes = diff(before, after);
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'removed_part',
      entityId: r.id,
      action: 'update',
      summary: `Changed removed part ${r.description}: ${changedFields(changes)}`,
      changes,
    });
    return after;
  });
}

export async function deleteRemovedPart(actor: Person, build: Build, id: number) {
  await sequelize.transaction(async (t) => {
    const r = await find(build.id, id, t);
    const before = toRemovedPartRecord(r);
    await r.destroy({ transaction: t });
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'removed_part',
      entityId: r.id,
      action: 'delete',
      summary: `Deleted removed part ${r.description}`,
      before,
    });
  });
}
