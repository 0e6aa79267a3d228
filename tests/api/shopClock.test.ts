// The shop's own clock for slips and the sales payback (issue 12, deliverable 5): at 23:30 in Denver,
// when UTC has already moved to the next day, "today" is still Denver's day on both routes.
import { describe, it, expect, beforeAll, afterEach, vi } from 'vitest';
import { signInAs } from '../helpers/api';
import { Build, Upgrade, sequelize } from '../../server/models';

let owner: Awaited<ReturnType<typeof signInAs>>;
let seq = 0;
const makeBuild = async (timeZone: string) => {
  seq += 1;
  const b = await Build.create({
    slug: `shop-clock-${seq}`,
    name: `Shop clock ${seq}`,
    year: 2020,
    make: 'Halvorsen',
    model: 'Tern',
    vin: null,
    mileage: null,
    campaign: null,
    summary: null,
    budgetCents: 1_000_000,
    labourRateCents: 10_000,
    startDate: '2026-01-05',
    timeZone,
  } as never);
  return b.reload();
};
const upgrade = (buildId: number, title: string) =>
  Upgrade.create({
    buildId,
    title,
    area: 'front',
    estimatedHours: 2,
    replaces: null,
    becomes: null,
    episodeId: null,
    episodePosition: null,
    notes: null,
    tireFrom: null,
    tireTo: null,
    installedOn: null,
  } as never);
async function part(
  buildId: number,
  upgradeId: number,
  partNumber: string,
  state: string,
  expectedArrival: string | null,
) {
  await sequelize.query(
    `INSERT INTO parts (build_id, upgrade_id, part_number, description, quantity, unit_cost_cents, state, expected_arrival) VALUES ($1,$2,$3,'Bracket',1,50000,$4,$5)`,
    { bind: [buildId, upgradeId, partNumber, state, expectedArrival] },
  );
}

beforeAll(async () => {
  owner = await signInAs('owner');
});
afterEach(() => {
  vi.useRealTimers();
});

/** 2026-03-14 23:30 MDT (UTC−6) is 2026-03-15 05:30 UTC. */
const lateShiftInDenver = () => {
  vi.useFakeTimers({ toFake: ['Date'] });
  vi.setSystemTime(new Date('2026-03-15T05:30:00Z'));
};

describe('slips on the build’s clock', () => {
  it('a part due today in Denver is not overdue at 23:30 there, though UTC is on the next day', async () => {
    lateShiftInDenver();
    const results: Record<string, { today: string; overdue: number }> = {};
    for (const zone of ['America/Denver', 'UTC']) {
      const b = await makeBuild(zone);
      const u = await upgrade(b.id, 'Bumper bracket');
      await part(b.id, u.id, `TN-CLK-${zone}`, 'ordered', '2026-03-14');
      const slips = await owner.get(`/api/builds/${b.id}/slips`);
      expect(slips.status).toBe(200);
      const notices = await owner.get(`/api/builds/${b.id}/notices`);
      expect(notices.status).toBe(200);
      results[zone] = {
        today: slips.body.today,
        overdue: notices.body.notices.filter((n: { kind: string }) => n.kind === 'part_overdue').length,
      };
    }
    // Denver: the 14th, the part is due today, not overdue. UTC: the 15th, the part was due yesterday.
    expect(results['America/Denver']).toEqual({ today: '2026-03-14', overdue: 0 });
    expect(results.UTC).toEqual({ today: '2026-03-15', overdue: 1 });
  });
});

describe('the sales payback on the build’s clock', () => {
  it('dates money not yet dated (a part not ordered) on Denver’s day at 23:30 there', async () => {
    lateShiftInDenver();
    const b = await makeBuild('America/Denver');
    const u = await upgrade(b.id, 'Skid plate');
    await part(b.id, u.id, 'TN-CLK-SKID', 'to_order', null);
    const res = await owner.get(`/api/builds/${b.id}/sales`);
    expect(res.status).toBe(200);
    expect(res.body.asOf).toBe('2026-03-14');
    // The $500.00 part, the build's only money, falls on the status date.
    expect(res.body.payback.points).toEqual([
      { date: '2026-03-14', cumulativeMarginCents: 0, cumulativeNetCostCents: 50_000 },
    ]);
    expect(res.body.payback.paybackDate).toBeNull();
    expect(res.body.payback.marginNeededCents).toBe(50_000);
  });
});
