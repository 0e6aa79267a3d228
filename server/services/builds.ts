// Builds: list with progress and spend, create, read, update (optimistic lock), delete.
import { QueryTypes, type Transaction } from 'sequelize';
import { sequelize, Build } from '../models';
import { AppError, forbidden, notFound } from '../errors';
import { record } from './activity';
import { seesMoney } from './visibility';
import { allow, audienceOf } from '../../shared/contracts/common';
import { Build as BuildContract, type BuildForMoney } from '../../shared/contracts/build';
import type { Plain } from './backlogRecords';
import { rollUpCosts } from '../../shared/costs';
import type { Disposition, PartState } from '../../shared/domain';
import type { CreateBuildInput, UpdateBuildInput } from '../../shared/schemas/build';

export type Person = { id: number; name: string; roles: readonly string[] };

/** Every field of a build (the route's contract decides what leaves per role). */
export function toBuildRecord(b: Build): Plain<BuildForMoney> {
  return {
    id: b.id,
    slug: b.slug,
    name: b.name,
    year: b.year,
    make: b.make,
    model: b.model,
    trim: b.trim,
    vin: b.vin,
    vinCheckOverridden: b.vinCheckOverridden,
    mileage: b.mileage,
    budgetCents: b.budgetCents,
    labourRateCents: b.labourRateCents,
    shopHoursPerWeek: b.shopHoursPerWeek,
    shootHoursPerEpisode: b.shootHoursPerEpisode,
    releaseCadenceDays: b.releaseCadenceDays,
    startDate: b.startDate,
    isPublic: b.isPublic,
    campaign: b.campaign,
    summary: b.summary,
    timeZone: b.timeZone,
    costRecognition: b.costRecognition,
    currency: b.currency,
    attributionWindowDays: b.attributionWindowDays,
    version: b.version,
  };
}

/** Money-bearing fields only the owner may set on a build. */
const OWNER_ONLY = ['budgetCents', 'labourRateCents', 'costRecognition'] as const;

function refuseOwnerOnly(actor: Person, input: Record<string, unknown>) {
  if (actor.roles.includes('owner')) return;
  const named = OWNER_ONLY.filter((f) => input[f] !== undefined);
  if (named.length) throw forbidden(`Only the owner may set ${named.join(' and ')}.`);
}

/** Net spend of one build (parts + labour + expenses − sold removed parts), the same roll-up as the overview. */
async function spentCents(build: Build): Promise<number> {
  const q = <T extends object>(sql: string): Promise<T[]> =>
    sequelize.query<T>(sql, { replacements: { b: build.id }, type: QueryTypes.SELECT });
  const [upgrades, parts, labour, expenses, removedParts] = await Promise.all([
    q<{ id: number; area: 'front'; episodeId: number | null; estimatedHours: number; valueAddedCents: number }>(
      `SELECT id, area, episode_id AS "episodeId", estimated_hours AS "estimatedHours", value_added_cents AS "valueAddedCents" FROM upgrades WHERE build_id = :b`,
    ),
    q<{ upgradeId: number; quantity: number; unitCostCents: number; state: PartState }>(
      `SELECT upgrade_id AS "upgradeId", quantity, unit_cost_cents AS "unitCostCents", state FROM parts WHERE build_id = :b`,
    ),
    q<{ upgradeId: number; hours: number }>(
      `SELECT upgrade_id AS "upgradeId", hours FROM labour_entries WHERE build_id = :b`,
    ),
    q<{ upgradeId: number | null; amountCents: number }>(
      `SELECT upgrade_id AS "upgradeId", amount_cents AS "amountCents" FROM expenses WHERE build_id = :b`,
    ),
    q<{
      upgradeId: number | null;
      disposition: Disposition;
      expectedSaleCents: number | null;
      actualSaleCents: number | null;
    }>(
      `SELECT upgrade_id AS "upgradeId", disposition, expected_sale_cents AS "expectedSaleCents", actual_sale_cents AS "actualSaleCents" FROM removed_parts WHERE build_id = :b`,
    ),
  ]);
  return rollUpCosts({ labourRateCents: build.labourRateCents ?? 0, upgrades, parts, labour, expenses, removedParts })
    .build.netCents;
}

export async function listBuilds(viewer: Person) {
  const builds = await Build.findAll({
    order: [
      ['createdAt', 'ASC'],
      ['id', 'ASC'],
    ],
  });
  const progress = await sequelize.query<{ buildId: number; total: number; done: number }>(
    `SELECT build_id AS "buildId", count(*)::int AS total,
            count(*) FILTER (WHERE install_state = 'installed' AND install_segment = 'shot' AND demo_segment = 'shot')::int AS done
       FROM upgrades GROUP BY build_id`,
    { type: QueryTypes.SELECT },
  );
  const byBuild = new Map(progress.map((p) => [p.buildId, p]));
  const money = seesMoney(viewer);
  const out = [];
  for (const b of builds) {
    const p = byBuild.get(b.id);
    // Spend is worked out only for roles that see money; the route's allow-list sends it to them alone.
    out.push({
      ...toBuildRecord(b),
      upgradesDone: p?.done ?? 0,
      upgradesTotal: p?.total ?? 0,
      spentCents: money ? await spentCents(b) : 0,
    });
  }
  return out;
}

export async function createBuild(actor: Person, input: CreateBuildInput) {
  refuseOwnerOnly(actor, input);
  return sequelize.transaction(async (t) => {
    if (await Build.findOne({ where: { slug: input.slug }, transaction: t })) {
      throw new AppError(409, 'duplicate', 'Another build already uses this slug.', [
        { path: 'slug', message: 'is already used' },
      ]);
    }
    const { vinCheckOverridden, ...rest } = input;
    const build = await Build.create(
      {
        ...rest,
        vin: rest.vin ?? null,
        mileage: rest.mileage ?? null,
        budgetCents: rest.budgetCents ?? null,
        labourRateCents: rest.labourRateCents ?? null,
        campaign: rest.campaign ?? null,
        summary: rest.summary ?? null,
        vinCheckOverridden: !!(rest.vin && vinCheckOverridden),
      },
      { transaction: t },
    );
    await build.reload({ transaction: t }); // version and database defaults
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'build',
      entityId: build.id,
      action: 'create',
      summary: `Created build ${build.name}`,
      after: toBuildRecord(build),
    });
    return toBuildRecord(build);
  });
}

/** 409 'stale' carrying the record as it is now, so the client can reload or re-apply. */
export function stale(current: Record<string, unknown>) {
  return new AppError(
    409,
    'stale',
    'Someone else changed this record since you loaded it. Reload to see their change, or re-apply yours.',
    undefined,
    { current },
  );
}

export async function updateBuild(actor: Person, buildId: number, input: UpdateBuildInput) {
  refuseOwnerOnly(actor, input);
  return sequelize.transaction(async (t) => {
    const build = await Build.findByPk(buildId, { transaction: t, lock: t.LOCK.UPDATE });
    if (!build) throw notFound('Build');
    if (build.version !== input.version)
      throw stale(allow(BuildContract[audienceOf(actor.roles)], toBuildRecord(build)));
    if (
      input.slug &&
      input.slug !== build.slug &&
      (await Build.findOne({ where: { slug: input.slug }, transaction: t }))
    ) {
      throw new AppError(409, 'duplicate', 'Another build already uses this slug.', [
        { path: 'slug', message: 'is already used' },
      ]);
    }
    const before = toBuildRecord(build);
    const { version: _v, vinCheckOverridden, ...changes } = input;
    build.set(changes as Partial<Build>);
    // The override only ever covers the VIN it was given with; a new VIN must pass or be overridden again.
    if (input.vin !== undefined || vinCheckOverridden !== undefined)
      build.vinCheckOverridden = !!(build.vin && vinCheckOverridden);
    await build.save({ transaction: t });
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'build',
      entityId: build.id,
      action: 'update',
      summary: `Changed build ${build.name}`,
      before,
      after: toBuildRecord(build),
    });
    return toBuildRecord(build);
  });
}

export async function deleteBuild(actor: Person, buildId: number) {
  await sequelize.transaction(async (t: Transaction) => {
    const build = await Build.findByPk(buildId, { transaction: t, lock: t.LOCK.UPDATE });
    if (!build) throw notFound('Build');
    // Prerequisite links point at upgrades with RESTRICT; clear them before the cascade runs.
    await sequelize.query('DELETE FROM upgrade_prerequisites WHERE build_id = :b', {
      replacements: { b: build.id },
      transaction: t,
    });
    await build.destroy({ transaction: t });
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'build',
      entityId: build.id,
      action: 'delete',
      summary: `Deleted build ${build.name}`,
      before: toBuildRecord(build),
    });
  });
}
