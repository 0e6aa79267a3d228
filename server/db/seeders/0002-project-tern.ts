// The "Project Tern" demo build: upgrades with prerequisites, parts, removed parts, labour and
// expenses (data in ./data/project-tern.ts). Demo mode only; episodes come from seeder 0003.
import type { MigrationContext } from '../migrate';
import {
  Activity,
  Build,
  Expense,
  LabourEntry,
  Part,
  RemovedPart,
  Upgrade,
  UpgradePrerequisite,
  User,
} from '../../models';
import { DEMO_USERS } from './0001-demo-users';
import {
  TERN_BUILD,
  TERN_EXPENSES,
  TERN_LABOUR,
  TERN_UPGRADES,
  productUrlFor,
  type SeedStatus,
} from './data/project-tern';

const cents = (dollars: number) => Math.round(dollars * 100);

function statesFor(status: SeedStatus) {
  switch (status) {
    case 'done':
      return { installState: 'installed', installSegment: 'shot', demoSegment: 'shot' } as const;
    case 'installed':
      return { installState: 'installed', installSegment: 'shot', demoSegment: 'not_shot' } as const;
    case 'in_bay':
      return { installState: 'in_bay', installSegment: 'not_shot', demoSegment: 'not_shot' } as const;
    default:
      return { installState: 'queued', installSegment: 'not_shot', demoSegment: 'not_shot' } as const;
  }
}

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  // umzug runs this once per database; the slug check also keeps a hand-made build of that name safe.
  if (await Build.findOne({ where: { slug: TERN_BUILD.slug } })) return;
  const installerEmail = DEMO_USERS.find((u) => u.roles.includes('installer' as never))!.email;
  const producerEmail = DEMO_USERS.find((u) => u.roles.includes('producer' as never))!.email;

  await sequelize.transaction(async (transaction) => {
    const installer = await User.findOne({ where: { email: installerEmail }, transaction });
    const producer = await User.findOne({ where: { email: producerEmail }, transaction });
    const build = await Build.create({ ...TERN_BUILD }, { transaction });
    const ids = new Map<string, number>();

    for (const u of TERN_UPGRADES) {
      const upgrade = await Upgrade.create(
        {
          buildId: build.id,
          title: u.title,
          replaces: u.replaces,
          becomes: u.becomes,
          area: u.area,
          estimatedHours: u.hours,
          valueAddedCents: cents(u.value),
          priority: u.priority,
          safetyFlags: u.flags,
          ...statesFor(u.status),
          installedOn: u.installedOn ?? null,
          episodeId: null,
          episodePosition: null,
          notes: u.notes ?? null,
          tireFrom: u.tireFrom ?? null,
          tireTo: u.tireTo ?? null,
        },
        { transaction },
      );
      ids.set(u.key, upgrade.id);
      await Part.bulkCreate(
        u.parts.map((p) => ({
          buildId: build.id,
          upgradeId: upgrade.id,
          partNumber: p.pn,
          description: p.desc,
          quantity: p.qty ?? 1,
          unitCostCents: cents(p.cost),
          retailPriceCents: p.retail === null ? null : cents(p.retail),
          supplier: p.supplier,
          condition: p.condition ?? 'new',
          productUrl: p.url ? productUrlFor(p.pn) : null,
          expectedArrival: p.expected ?? p.received ?? null,
          orderedOn: p.ordered ?? null,
          receivedOn: p.received ?? null,
          state: p.state,
        })),
        { transaction },
      );
      if (u.removed?.length) {
        await RemovedPart.bulkCreate(
          u.removed.map((r) => ({
            buildId: build.id,
            upgradeId: upgrade.id,
            description: r.desc,
            partNumber: r.pn ?? null,
            disposition: r.disposition,
            expectedSaleCents: r.expected === undefined ? null : cents(r.expected),
            actualSaleCents: r.actual === undefined ? null : cents(r.actual),
            soldOn: r.soldOn ?? null,
          })),
          { transaction },
        );
      }
    }

    const edges = TERN_UPGRADES.flatMap((u) =>
      (u.needs ?? []).map((n) => ({ buildId: build.id, upgradeId: ids.get(u.key)!, prerequisiteId: ids.get(n)! })),
    );
    await UpgradePrerequisite.bulkCreate(edges, { transaction });

    await LabourEntry.bulkCreate(
      TERN_LABOUR.map((l) => {
        const person = l.by === 'producer' ? producer : installer;
        return {
          buildId: build.id,
          upgradeId: ids.get(l.upgrade)!,
          userId: person?.id ?? null,
          personName: person?.name ?? 'Shop',
          workedOn: l.on,
          hours: l.hours,
          kind: l.kind,
          note: l.note ?? null,
        };
      }),
      { transaction },
    );
    await Expense.bulkCreate(
      TERN_EXPENSES.map((e) => ({
        buildId: build.id,
        upgradeId: e.upgrade ? ids.get(e.upgrade)! : null,
        description: e.desc,
        amountCents: cents(e.amount),
        spentOn: e.on,
        category: e.category,
      })),
      { transaction },
    );
    await Activity.create(
      {
        buildId: build.id,
        userId: producer?.id ?? null,
        userName: producer?.name ?? null,
        entity: 'build',
        entityId: build.id,
        action: 'create',
        summary: `Created ${build.name} with ${TERN_UPGRADES.length} planned upgrades (demo data)`,
        changes: {},
      },
      { transaction },
    );
  });
}

export async function down() {}
