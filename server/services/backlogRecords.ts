// Plain API records for the backlog's models, the build-scoped lookups every backlog service shares,
// and the activity view with money removed per role.
import { Op, type Transaction } from 'sequelize';
import { Activity, Expense, LabourEntry, Part, RemovedPart, Upgrade, UpgradePrerequisite } from '../models';
import { AppError, badRequest, notFound } from '../errors';
import { forViewer, RETAIL_FIELDS, SHOP_MONEY_FIELDS, seesMoney, seesRetail, type Viewer } from './visibility';
import type { UpgradeForMoney } from '../../shared/contracts/upgrade';
import type { PartForMoney } from '../../shared/contracts/part';
import type { RemovedPartForMoney } from '../../shared/contracts/removedPart';
import type { LabourEntry as LabourEntryRecord } from '../../shared/contracts/labour';
import type { Expense as ExpenseRecord } from '../../shared/contracts/expense';
import { readableChanges } from './activity';
import { audienceOf, allow, audiences, type Audience, type Audiences } from '../../shared/contracts/common';
import { Upgrade as UpgradeContract } from '../../shared/contracts/upgrade';
import { Part as PartContract } from '../../shared/contracts/part';
import { RemovedPart as RemovedPartContract } from '../../shared/contracts/removedPart';
import { LabourEntry as LabourContract } from '../../shared/contracts/labour';
import { Expense as ExpenseContract } from '../../shared/contracts/expense';
import { z } from 'zod';

export type Person = { id: number; name: string; roles: readonly string[] };
/** An interface as a plain object type, so it fits Record<string, unknown> (forViewer, activity). */
export type Plain<T> = { [K in keyof T]: T[K] };

/** Every field of an upgrade (the route's contract decides what leaves per role). */
export function toUpgradeRecord(u: Upgrade, prerequisiteIds: number[]): Plain<UpgradeForMoney> {
  return {
    id: u.id,
    buildId: u.buildId,
    title: u.title,
    replaces: u.replaces,
    becomes: u.becomes,
    area: u.area,
    estimatedHours: u.estimatedHours,
    valueAddedCents: u.valueAddedCents,
    priority: u.priority,
    safetyFlags: u.safetyFlags,
    installState: u.installState,
    installSegment: u.installSegment,
    demoSegment: u.demoSegment,
    installedOn: u.installedOn,
    episodeId: u.episodeId,
    episodePosition: u.episodePosition,
    notes: u.notes,
    tireFrom: u.tireFrom,
    tireTo: u.tireTo,
    prerequisiteIds: [...prerequisiteIds].sort((a, b) => a - b),
    version: u.version,
  };
}

export function toPartRecord(p: Part): Plain<PartForMoney> {
  return {
    id: p.id,
    buildId: p.buildId,
    upgradeId: p.upgradeId,
    partNumber: p.partNumber,
    description: p.description,
    quantity: p.quantity,
    unitCostCents: p.unitCostCents,
    retailPriceCents: p.retailPriceCents,
    supplier: p.supplier,
    condition: p.condition,
    productUrl: p.productUrl,
    expectedArrival: p.expectedArrival,
    orderedOn: p.orderedOn,
    receivedOn: p.receivedOn,
    state: p.state,
    storeSku: p.storeSku ?? null,
    version: p.version,
  };
}

export function toRemovedPartRecord(r: RemovedPart): Plain<RemovedPartForMoney> {
  return {
    id: r.id,
    buildId: r.buildId,
    upgradeId: r.upgradeId,
    description: r.description,
    partNumber: r.partNumber,
    disposition: r.disposition,
    expectedSaleCents: r.expectedSaleCents,
    actualSaleCents: r.actualSaleCents,
    soldOn: r.soldOn,
  };
}

export function toLabourRecord(l: LabourEntry): Plain<LabourEntryRecord> {
  return {
    id: l.id,
    buildId: l.buildId,
    upgradeId: l.upgradeId,
    userId: l.userId,
    personName: l.personName,
    workedOn: l.workedOn,
    hours: l.hours,
    kind: l.kind,
    note: l.note,
  };
}

export function toExpenseRecord(e: Expense): Plain<ExpenseRecord> {
  return {
    id: e.id,
    buildId: e.buildId,
    upgradeId: e.upgradeId,
    description: e.description,
    amountCents: e.amountCents,
    spentOn: e.spentOn,
    category: e.category,
  };
}

/** The upgrade `id` of build `buildId`, or 404 (a record of another build is "not found"). */
export async function findUpgrade(buildId: number, id: number, t?: Transaction, lock = false) {
  const u = await Upgrade.findOne({
    where: { id, buildId },
    transaction: t,
    ...(lock && t ? { lock: t.LOCK.UPDATE } : {}),
  });
  if (!u) throw notFound('Upgrade');
  return u;
}

/** An upgrade id named in a body must belong to the build: otherwise 400 naming the field. */
export async function requireUpgradeInBuild(
  buildId: number,
  id: number | null | undefined,
  field = 'upgradeId',
  t?: Transaction,
) {
  if (id === null || id === undefined) return null;
  const u = await Upgrade.findOne({ where: { id, buildId }, transaction: t });
  if (!u)
    throw badRequest(`Check these fields: ${field}.`, [{ path: field, message: 'is not an upgrade of this build' }]);
  return u;
}

/** Prerequisite ids per upgrade of a build. */
export async function prerequisiteMap(buildId: number, t?: Transaction, upgradeIds?: number[]) {
  const where: Record<string, unknown> = { buildId };
  if (upgradeIds) where.upgradeId = { [Op.in]: upgradeIds };
  const links = await UpgradePrerequisite.findAll({ where, transaction: t });
  const map = new Map<number, number[]>();
  for (const l of links) {
    const list = map.get(l.upgradeId) ?? [];
    list.push(l.prerequisiteId);
    map.set(l.upgradeId, list);
  }
  return map;
}

export async function upgradeRecord(u: Upgrade, t?: Transaction) {
  const map = await prerequisiteMap(u.buildId, t, [u.id]);
  return toUpgradeRecord(u, map.get(u.id) ?? []);
}

/**
 * 409 'stale' carrying the record as it is now, as the person's contract allows it (or, without
 * contracts, with money removed per role), so the client can reload or re-apply.
 */
export function stale(current: Record<string, unknown>, viewer: Viewer, contracts?: Audiences) {
  return new AppError(
    409,
    'stale',
    'Someone else changed this record since you loaded it. Reload to see their change, or re-apply yours.',
    undefined,
    {
      current: contracts ? allow(contracts[audienceOf(viewer.roles)], current as never) : forViewer(current, viewer),
    },
  );
}

/** The record contract of each entity the backlog's history holds: its fields are the allow-list of a change. */
const HISTORY_CONTRACTS: Record<string, Audiences> = {
  upgrade: UpgradeContract,
  part: PartContract,
  removed_part: RemovedPartContract,
  labour: audiences(LabourContract, LabourContract),
  // Expenses are money through and through: the crew's contract names nothing of them.
  expense: audiences(ExpenseContract, z.object({})),
};
const allowedKeys = (entity: string, audience: Audience): ReadonlySet<string> | null => {
  const c = HISTORY_CONTRACTS[entity]?.[audience];
  return c instanceof z.ZodObject ? new Set(Object.keys(c.shape)) : null;
};

/**
 * Activity rows as a person may read them: for the backlog's records, only the changed fields the
 * person's contract for that record names (an allow-list); for others, money figures removed.
 */
export function activityView(rows: Activity[], viewer: Viewer) {
  const hidden = new Set<string>([
    ...(seesMoney(viewer) ? [] : SHOP_MONEY_FIELDS),
    ...(seesRetail(viewer) ? [] : RETAIL_FIELDS),
  ]);
  const audience = audienceOf(viewer.roles);
  const visible = (entity: string, changes: Activity['changes']) => {
    const allowed = allowedKeys(entity, audience);
    return Object.fromEntries(
      Object.entries(changes ?? {}).filter(([k]) => (allowed ? allowed.has(k) : !hidden.has(k))),
    );
  };
  return rows.map((a) => ({
    id: Number(a.id),
    entity: a.entity,
    entityId: a.entityId,
    action: a.action,
    summary: a.summary,
    userId: a.userId,
    userName: a.userName,
    createdAt: new Date(a.createdAt).toISOString(),
    changes: visible(a.entity, a.changes),
    readable: readableChanges(visible(a.entity, a.changes), { money: seesMoney(viewer), retail: seesRetail(viewer) }),
  }));
}

/** Names of the changed fields, for a summary line that never carries money values. */
export function changedFields(changes: Record<string, unknown>) {
  return Object.keys(changes).join(', ') || 'nothing';
}
