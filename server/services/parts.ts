// Parts on a build's upgrades: list with filters and paging, create, update field by field per role
// (marketing: product page only; installer: receive or fit), delete.
import { type Transaction, type WhereOptions } from 'sequelize';
import { sequelize, Build, Part } from '../models';
import { badRequest, forbidden, notFound } from '../errors';
import { diff, record } from './activity';
import { noticePartMovedLater, refreshSlipNotices } from './slips';
import { toDay } from '../../shared/planner/dates';
import { changedFields, requireUpgradeInBuild, stale, toPartRecord, type Person } from './backlogRecords';
import { Part as PartContract } from '../../shared/contracts/part';
import {
  INSTALLER_PART_FIELDS,
  INSTALLER_PART_STATES,
  MARKETING_PART_FIELDS,
  type CreatePartInput,
  type UpdatePartInput,
} from '../../shared/schemas/part';
import { todayIn } from '../../shared/dates';

const has = (p: Person, ...roles: string[]) => p.roles.some((r) => r === 'owner' || roles.includes(r));

/** A page of parts, every field: the route sends each person's allow-list of them (shared/contracts/part.ts). */
export async function listParts(
  build: Build,
  q: { upgradeId?: number; state?: string; page: number; pageSize: number },
) {
  const where: WhereOptions<Part> & Record<string, unknown> = { buildId: build.id };
  if (q.upgradeId) where.upgradeId = q.upgradeId;
  if (q.state) where.state = q.state;
  const { rows, count } = await Part.findAndCountAll({
    where,
    order: [
      ['upgradeId', 'ASC'],
      ['id', 'ASC'],
    ],
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
  });
  return { parts: rows.map(toPartRecord), total: count, page: q.page, pageSize: q.pageSize };
}

async function findPart(buildId: number, id: number, t?: import('sequelize').Transaction) {
  const p = await Part.findOne({ where: { id, buildId }, transaction: t, ...(t ? { lock: t.LOCK.UPDATE } : {}) });
  if (!p) throw notFound('Part');
  return p;
}

export async function createPart(actor: Person, build: Build, input: CreatePartInput) {
  return sequelize.transaction(async (t) => {
    const u = await requireUpgradeInBuild(build.id, input.upgradeId, 'upgradeId', t);
    const p = await Part.create({ ...(input as Required<CreatePartInput>), buildId: build.id }, { transaction: t });
    await p.reload({ transaction: t }); // version and database defaults
    const rec = toPartRecord(p);
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'part',
      entityId: p.id,
      action: 'create',
      summary: `Added part ${p.partNumber} to ${u!.title}`,
      after: rec,
    });
    return rec;
  });
}

/** Which fields this person may change on a part: everything, the product page, or receiving. */
function refuseFields(actor: Person, input: UpdatePartInput) {
  if (has(actor, 'producer')) return;
  const keys = Object.keys(input);
  const allowed: readonly string[] = [
    ...(actor.roles.includes('marketing') ? MARKETING_PART_FIELDS : []),
    ...(actor.roles.includes('installer') ? INSTALLER_PART_FIELDS : []),
  ];
  const refused = keys.filter((k) => !allowed.includes(k));
  if (refused.length) throw forbidden(`Your role may not change ${refused.join(', ')} on a part.`);
  if (
    input.state !== undefined &&
    !actor.roles.includes('marketing') &&
    !(INSTALLER_PART_STATES as readonly string[]).includes(input.state)
  ) {
    throw forbidden('An installer may only mark a part received or fitted.');
  }
}

export async function updatePart(actor: Person, build: Build, id: number, input: UpdatePartInput) {
  refuseFields(actor, input);
  return sequelize.transaction(async (t) => {
    const p = await findPart(build.id, id, t);
    if (input.version !== undefined && input.version !== p.version) throw stale(toPartRecord(p), actor, PartContract);
    const { version: _v, ...fields } = input;
    if (fields.upgradeId !== undefined) await requireUpgradeInBuild(build.id, fields.upgradeId, 'upgradeId', t);
    // Receiving a part records the day, unless the person gave one.
    if (fields.state === 'received' && p.state !== 'received' && fields.receivedOn === undefined && !p.receivedOn)
      fields.receivedOn = todayIn(build.timeZone);
    const before = toPartRecord(p);
    p.set(fields as Partial<Part>);
    if (p.receivedOn && p.orderedOn && p.receivedOn < p.orderedOn) {
      throw badRequest('Check these fields: receivedOn.', [
        { path: 'receivedOn', message: 'cannot be before the order date' },
      ]);
    }
    await p.save({ transaction: t });
    const after = toPartRecord(p);
    const changes = diff(before, after);
    const moved = arrivalMove(before.expectedArrival, after.expectedArrival);
    const summary = moved
      ? `${moved} for part ${p.partNumber}`
      : `Changed part ${p.partNumber}: ${changedFields(changes)}`;
    await record(t, { actor, buildId: build.id, entity: 'part', entityId: p.id, action: 'update', summary, changes });
    await afterPartChange(t, build, before, after);
    return after;
  });
}

/** "Expected arrival moved from A to B (n days later)" when the date changed, else null. */
function arrivalMove(from: string | null, to: string | null): string | null {
  if (from === to) return null;
  if (!to) return `Expected arrival cleared (was ${from})`;
  if (!from) return `Expected arrival set to ${to}`;
  const days = toDay(to) - toDay(from);
  return `Expected arrival moved from ${from} to ${to} (${Math.abs(days)} day${Math.abs(days) === 1 ? '' : 's'} ${days > 0 ? 'later' : 'earlier'})`;
}

/** A part coming later, or no longer coming, can make episodes slip: recompute and tell producers. */
async function afterPartChange(
  t: Transaction,
  build: Build,
  before: ReturnType<typeof toPartRecord>,
  after: ReturnType<typeof toPartRecord>,
) {
  const later = after.expectedArrival && (!before.expectedArrival || after.expectedArrival > before.expectedArrival);
  const stateChanged = before.state !== after.state;
  if (!later && !stateChanged) return;
  if (later && !['received', 'fitted', 'returned'].includes(after.state))
    await noticePartMovedLater(
      t,
      build,
      { id: after.id, partNumber: after.partNumber, description: after.description },
      before.expectedArrival,
      after.expectedArrival!,
    );
  await refreshSlipNotices(t, build);
}

export async function deletePart(actor: Person, build: Build, id: number) {
  await sequelize.transaction(async (t) => {
    const p = await findPart(build.id, id, t);
    const before = toPartRecord(p);
    await p.destroy({ transaction: t });
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'part',
      entityId: p.id,
      action: 'delete',
      summary: `Deleted part ${p.partNumber}`,
      before,
    });
  });
}
