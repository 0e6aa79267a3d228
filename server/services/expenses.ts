// Other costs of a build (consumables, shipping, filming), optionally on an upgrade. Owner and producer only.
import { sequelize, Build, Expense } from '../models';
import { notFound } from '../errors';
import { diff, record } from './activity';
import { changedFields, requireUpgradeInBuild, toExpenseRecord, type Person } from './backlogRecords';
import type { CreateExpenseInput, UpdateExpenseInput } from '../../shared/schemas/expense';

export async function listExpenses(build: Build, q: { upgradeId?: number }) {
  const where: Record<string, unknown> = { buildId: build.id };
  if (q.upgradeId) where.upgradeId = q.upgradeId;
  const rows = await Expense.findAll({
    where,
    order: [
      ['spentOn', 'DESC'],
      ['id', 'DESC'],
    ],
  });
  return rows.map(toExpenseRecord);
}

async function find(buildId: number, id: number, t: import('sequelize').Transaction) {
  const e = await Expense.findOne({ where: { id, buildId }, transaction: t, lock: t.LOCK.UPDATE });
  if (!e) throw notFound('Expense');
  return e;
}

export async function createExpense(actor: Person, build: Build, input: CreateExpenseInput) {
  return sequelize.transaction(async (t) => {
    await requireUpgradeInBuild(build.id, input.upgradeId, 'upgradeId', t);
    const e = await Expense.create(
      { ...(input as Required<CreateExpenseInput>), upgradeId: input.upgradeId ?? null, buildId: build.id },
      { transaction: t },
    );
    const rec = toExpenseRecord(e);
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'expense',
      entityId: e.id,
      action: 'create',
      summary: `Added expense ${e.description}`,
      after: rec,
    });
    return rec;
  });
}

export async function updateExpense(actor: Person, build: Build, id: number, input: UpdateExpenseInput) {
  return sequelize.transaction(async (t) => {
    const e = await find(build.id, id, t);
    if (input.upgradeId !== undefined) await requireUpgradeInBuild(build.id, input.upgradeId, 'upgradeId', t);
    const before = toExpenseRecord(e);
    e.set(input as Partial<Expense>);
    await e.save({ transaction: t });
    const after = toExpenseRecord(e);
    const changes = diff(before, after);
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'expense',
      entityId: e.id,
      action: 'update',
      summary: `Changed expense ${e.description}: ${changedFields(changes)}`,
      changes,
    });
    return after;
  });
}

export async function deleteExpense(actor: Person, build: Build, id: number) {
  await sequelize.transaction(async (t) => {
    const e = await find(build.id, id, t);
    const before = toExpenseRecord(e);
    await e.destroy({ transaction: t });
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'expense',
      entityId: e.id,
      action: 'delete',
      summary: `Deleted expense ${e.description}`,
      before,
    });
  });
}
