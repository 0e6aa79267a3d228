// GET /api/builds/:buildId/overview: figures to the cent against hand-worked sums and the raw rows,
// who may read it, builds with missing inputs, and a query count that does not grow with the build.
import { describe, it, expect, beforeAll } from 'vitest';
import { QueryTypes } from 'sequelize';
import { anonymous, signInAs } from '../helpers/api';
import { Build, Upgrade, Episode, sequelize } from '../../server/models';
import { queryCounter } from '../../server/db/sequelize';
import { buildOverview } from '../../server/services/overview';
import { overviewReads } from '../../server/services/overviewQuery';
import { runningFor, singleFlight } from '../../server/services/overviewCache';
import { earnedValue, roundHalfUpCents } from '../../shared/index';
import { expandOverview, type BuildOverview, type OverviewCostRow } from '../../shared/overview';
import { overviewAnswer, overviewAnswerWithoutMoney } from '../../shared/contracts/overview';
import { compactOverview } from '../../shared/overview';

let seq = 0;
async function makeBuild(fields: Partial<{ budgetCents: number | null; labourRateCents: number | null }> = {}) {
  seq += 1;
  return Build.create({
    slug: `overview-${seq}`,
    name: `Overview check ${seq}`,
    year: 2019,
    make: 'Halvorsen',
    model: 'Tern',
    vin: null,
    mileage: null,
    budgetCents: 'budgetCents' in fields ? fields.budgetCents! : 1_000_000,
    labourRateCents: 'labourRateCents' in fields ? fields.labourRateCents! : 8_550,
    campaign: null,
    summary: null,
    startDate: '2025-01-06',
  });
}

async function upgrade(buildId: number, f: Partial<Upgrade> & { title: string }) {
  return Upgrade.create({
    buildId,
    area: 'front',
    replaces: null,
    becomes: null,
    episodeId: null,
    episodePosition: null,
    notes: null,
    tireFrom: null,
    tireTo: null,
    installedOn: null,
    ...f,
  } as never);
}
async function part(
  buildId: number,
  upgradeId: number,
  quantity: number,
  unitCostCents: number,
  state = 'ordered',
  orderedOn: string | null = '2025-02-01',
) {
  await sequelize.query(
    `INSERT INTO parts (build_id, upgrade_id, part_number, description, quantity, unit_cost_cents, state, ordered_on) VALUES ($1,$2,'HT-1','Kit',$3,$4,$5,$6)`,
    { bind: [buildId, upgradeId, quantity, unitCostCents, state, orderedOn] },
  );
}
async function labour(buildId: number, upgradeId: number, workedOn: string, hours: number) {
  await sequelize.query(
    `INSERT INTO labour_entries (build_id, upgrade_id, person_name, worked_on, hours) VALUES ($1,$2,'Bay tech',$3,$4)`,
    { bind: [buildId, upgradeId, workedOn, hours] },
  );
}
async function expense(buildId: number, upgradeId: number | null, amountCents: number, spentOn = '2025-02-10') {
  await sequelize.query(
    `INSERT INTO expenses (build_id, upgrade_id, description, amount_cents, spent_on) VALUES ($1,$2,'Shop supplies',$3,$4)`,
    { bind: [buildId, upgradeId, amountCents, spentOn] },
  );
}
async function removed(
  buildId: number,
  upgradeId: number | null,
  disposition: string,
  expected: number | null,
  actual: number | null,
  soldOn: string | null = null,
) {
  await sequelize.query(
    `INSERT INTO removed_parts (build_id, upgrade_id, description, disposition, expected_sale_cents, actual_sale_cents, sold_on) VALUES ($1,$2,'Stock part',$3,$4,$5,$6)`,
    { bind: [buildId, upgradeId, disposition, expected, actual, soldOn] },
  );
}

/** Every number anywhere in the value is finite (JSON would hide NaN and Infinity as null). */
function nonFinite(v: unknown, path = '$'): string[] {
  if (typeof v === 'number') return Number.isFinite(v) ? [] : [path];
  if (Array.isArray(v)) return v.flatMap((x, i) => nonFinite(x, `${path}[${i}]`));
  if (v && typeof v === 'object') return Object.entries(v).flatMap(([k, x]) => nonFinite(x, `${path}.${k}`));
  return [];
}

const MONEY: (keyof OverviewCostRow)[] = [
  'partsCents',
  'labourCents',
  'expensesCents',
  'recoveredCents',
  'expectedRecoveryCents',
  'netCents',
  'valueAddedCents',
];
function sumRows(rows: OverviewCostRow[], key: keyof OverviewCostRow) {
  return rows.reduce((s, r) => s + ((r[key] as number | null) ?? 0), 0);
}

/** The overview's totals equal its detail rows, and its upgrade rows equal the raw rows of the database. */
async function expectAgreesWithDatabase(o: BuildOverview, buildId: number) {
  for (const k of MONEY) {
    expect(o.totals[k], `totals.${k} = upgrades + unassigned`).toBe(
      sumRows(o.upgrades, k) + ((o.unassigned[k] as number | null) ?? 0),
    );
    expect(sumRows(o.areas, k) + ((o.unassigned[k] as number | null) ?? 0), `areas.${k}`).toBe(o.totals[k] ?? 0);
    expect(sumRows(o.episodes, k) + ((o.unassigned[k] as number | null) ?? 0), `episodes.${k}`).toBe(o.totals[k] ?? 0);
  }
  const q = <T extends object>(sql: string): Promise<T[]> =>
    sequelize.query<T>(sql, { bind: [buildId], type: QueryTypes.SELECT });
  const parts = await q<{ upgrade_id: number; cents: number }>(
    `SELECT upgrade_id, sum(quantity * unit_cost_cents)::int AS cents FROM parts WHERE build_id = $1 AND state <> 'returned' GROUP BY upgrade_id`,
  );
  const hours = await q<{ upgrade_id: number; hours: number }>(
    `SELECT upgrade_id, sum(hours)::float8 AS hours FROM labour_entries WHERE build_id = $1 GROUP BY upgrade_id`,
  );
  const spent = await q<{ upgrade_id: number; cents: number }>(
    `SELECT upgrade_id, sum(amount_cents)::int AS cents FROM expenses WHERE build_id = $1 AND upgrade_id IS NOT NULL GROUP BY upgrade_id`,
  );
  const sold = await q<{ upgrade_id: number; cents: number }>(
    `SELECT upgrade_id, sum(actual_sale_cents)::int AS cents FROM removed_parts WHERE build_id = $1 AND disposition = 'sold' AND upgrade_id IS NOT NULL GROUP BY upgrade_id`,
  );
  const [{ n }] = await q<{ n: number }>(`SELECT count(*)::int AS n FROM upgrades WHERE build_id = $1`);
  expect(o.upgrades).toHaveLength(n);
  const rate = o.build.labourRateCents ?? 0;
  const of = (rows: { upgrade_id: number; cents?: number; hours?: number }[], id: number, k: 'cents' | 'hours') =>
    rows.find((r) => r.upgrade_id === id)?.[k] ?? 0;
  for (const u of o.upgrades) {
    expect(u.partsCents, `parts of ${u.title}`).toBe(of(parts, u.upgradeId, 'cents'));
    expect(u.actualHours).toBeCloseTo(of(hours, u.upgradeId, 'hours'), 6);
    if (o.labourCosted)
      expect(u.labourCents, `labour of ${u.title}`).toBe(roundHalfUpCents(of(hours, u.upgradeId, 'hours') * rate));
    expect(u.expensesCents).toBe(of(spent, u.upgradeId, 'cents'));
    expect(u.recoveredCents).toBe(of(sold, u.upgradeId, 'cents'));
    expect(u.netCents).toBe(u.partsCents + (u.labourCents ?? 0) + u.expensesCents - u.recoveredCents);
  }
}

let owner: Awaited<ReturnType<typeof signInAs>>;
let handMade: Build;
let ids: { u1: number; u2: number; u3: number; e1: number; e2: number };

beforeAll(async () => {
  owner = await signInAs('owner');
  // A build worked by hand: rate $85.50/h, budget $10,000.
  handMade = await makeBuild();
  const b = handMade.id;
  const e1 = await Episode.create({
    buildId: b,
    number: 1,
    title: 'Front end',
    state: 'live',
    shootDate: '2025-03-01',
  } as never);
  const e2 = await Episode.create({
    buildId: b,
    number: 2,
    title: 'Cabin comfort',
    state: 'scheduled',
    shootDate: '2025-04-01',
  } as never);
  const u1 = await upgrade(b, {
    title: 'Projector LED headlamps',
    area: 'front',
    estimatedHours: 4,
    valueAddedCents: 120_000,
    episodeId: e1.id,
    installState: 'installed',
    installSegment: 'shot',
    demoSegment: 'shot',
    installedOn: '2025-02-27',
  });
  const u2 = await upgrade(b, {
    title: 'Heated seats',
    area: 'cabin',
    estimatedHours: 0,
    valueAddedCents: 45_000,
    episodeId: e2.id,
  });
  const u3 = await upgrade(b, { title: 'Roof rails', area: 'rear', estimatedHours: 2 });
  await part(b, u1.id, 2, 15_000); // 300.00
  await part(b, u1.id, 1, 9_999, 'returned'); // returned: costs nothing
  await part(b, u2.id, 1, 50_000, 'to_order', null);
  await labour(b, u1.id, '2025-02-20', 1.5);
  await labour(b, u1.id, '2025-02-21', 2.25); // 3.75 h × 85.50 = 320.625 → 320.63
  await labour(b, u2.id, '2025-03-10', 0.47); // 0.47 h × 85.50 = 40.185 → 40.19 (half-up, see costs.ts)
  await expense(b, u1.id, 4_500);
  await expense(b, null, 1_250);
  await removed(b, u1.id, 'sold', 9_000, 7_000, '2025-03-05');
  await removed(b, u1.id, 'for_sale', 2_000, null);
  await removed(b, u1.id, 'keep', 5_000, null);
  ids = { u1: u1.id, u2: u2.id, u3: u3.id, e1: e1.id, e2: e2.id };
});

describe('GET /api/builds/:buildId/overview', () => {
  it('gives the owner every figure of a hand-worked build, to the cent', async () => {
    const res = await owner.get(`/api/builds/${handMade.id}/overview`);
    expect(res.status).toBe(200);
    const o = expandOverview(overviewAnswer.parse(res.body));
    const u1 = o.upgrades.find((u) => u.upgradeId === ids.u1)!;
    expect(u1).toMatchObject({
      partsCents: 30_000,
      labourCents: 32_063,
      expensesCents: 4_500,
      recoveredCents: 7_000,
      expectedRecoveryCents: 2_000,
      netCents: 59_563,
      estimatedHours: 4,
      actualHours: 3.75,
      done: true,
    });
    expect(u1.valuePerDollar).toBeCloseTo(120_000 / 59_563, 5); // sent to six significant digits
    expect(u1.hoursRatio).toBeCloseTo(3.75 / 4, 12);
    const u2 = o.upgrades.find((u) => u.upgradeId === ids.u2)!;
    expect(u2).toMatchObject({
      partsCents: 50_000,
      labourCents: 4_019,
      netCents: 54_019,
      hoursRatio: null,
      done: false,
    });
    const u3 = o.upgrades.find((u) => u.upgradeId === ids.u3)!;
    expect(u3).toMatchObject({ netCents: 0, valuePerDollar: null, hoursRatio: 0 });
    expect(o.unassigned).toMatchObject({ expensesCents: 1_250, netCents: 1_250 });
    expect(o.totals).toMatchObject({
      partsCents: 80_000,
      labourCents: 36_082,
      expensesCents: 5_750,
      recoveredCents: 7_000,
      netCents: 114_832,
    });
    expect(o.headline).toMatchObject({
      budgetCents: 1_000_000,
      spentCents: 121_832,
      recoveredCents: 7_000,
      expectedRecoveryCents: 2_000,
      netCents: 114_832,
      remainingCents: 885_168,
      upgradesDone: 1,
      upgradesTotal: 3,
      episodesLive: 1,
      episodesTotal: 2,
      valueAddedCents: 165_000,
    });
    expect(o.headline.spentShare).toBeCloseTo(0.114832, 12);
    // BAC = the upgrades' budgeted cost: U1 4 h × 85.50 + 300 = 642; U2 0 h + 500; U3 2 h × 85.50 = 171.
    // Reserve = 10,000 − 1,313 = 8,687.
    expect(o.headline).toMatchObject({ bacCents: 131_300, reserveCents: 868_700, costRecognition: 'fitting' });
    // Earned value, 0/100: all shoot dates are past, and U3 (in no episode) is planned on the last
    // one, so PV = BAC. EV = U1's budget (done). AC at fitting: U1's parts (its upgrade is installed),
    // all labour, expenses less the sale: 300 + 320.63 + 40.19 + 45 + 12.50 − 70 = 648.32; U2's
    // $500 part, not ordered, is not actual cost yet.
    expect(o.earnedValue).toMatchObject({
      rule: '0/100',
      bac: 131_300,
      pv: 131_300,
      ev: 64_200,
      ac: 64_832,
      unscheduledPlannedCents: 17_100,
    });
    expect(o.headline.actualCents).toBe(64_832);
    expect(o.headline.pending).toEqual({
      receivedNotFittedCents: 0,
      committedCents: 0,
      notOrderedCents: 50_000,
      laterDatedCents: 0,
    });
    // Cash: paid = labour 360.82 + expenses 57.50 − sale 70; committed = U1's ordered parts; not ordered = U2's part.
    expect(o.headline.cash).toEqual({
      paidCents: 34_832,
      committedCents: 30_000,
      notOrderedCents: 50_000,
      netCents: 114_832,
    });
    // Bottom-up: AC + U2 (0 h left, $500 of parts) + U3 (2 h × 85.50) = 648.32 + 500 + 171 = 1,319.32.
    expect(o.headline).toMatchObject({
      etcCents: 67_100,
      forecastCents: 131_932,
      forecastVarianceCents: 868_068,
      remainingHours: 2,
    });
    const f = earnedValue({ bac: 131_300, pv: 131_300, ev: 64_200, ac: 64_832, eac: 131_932 });
    for (const k of ['cv', 'sv', 'cpi', 'spi', 'eacCpi', 'eacOneOff', 'eacComposite', 'tcpi', 'tcpiEac'] as const)
      expect(o.earnedValue[k]).toBeCloseTo(f[k]!, 5);
    expect(o.earnedValue.ruleDescription).toMatch(/done/);
    // Areas in the vehicle's order; episodes by number, then the upgrades in no episode.
    expect(o.areas.map((a) => [a.area, a.upgrades])).toEqual([
      ['front', 1],
      ['rear', 1],
      ['cabin', 1],
    ]);
    expect(o.episodes.map((e) => [e.number, e.upgrades, e.netCents])).toEqual([
      [1, 1, 59_563],
      [2, 1, 54_019],
      [null, 1, 0],
    ]);
    // The burndown starts from the whole budget and ends where the budget stands now.
    expect(o.burndown[0]).toMatchObject({ date: '2025-01-06', planned: 1_000_000, actual: 1_000_000 });
    const lastActual = o.burndown.filter((p) => p.actual !== null).at(-1)!;
    expect(lastActual.actual).toBe(1_000_000 - 64_832);
    expect(o.burndown.at(-1)!.planned).toBe(868_700); // the plan ends on the reserve
    expect(o.burndown.at(-1)!.forecast).toBe(868_068); // the forecast ends on budget − the headline forecast
    await expectAgreesWithDatabase(o, handMade.id);
  });

  it('lets the producer read it and refuses installer and marketing (403) and anonymous callers (401)', async () => {
    expect((await (await signInAs('producer')).get(`/api/builds/${handMade.id}/overview`)).status).toBe(200);
    for (const role of ['installer', 'marketing'] as const) {
      const res = await (await signInAs(role)).get(`/api/builds/${handMade.id}/overview`);
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
      expect(JSON.stringify(res.body)).not.toMatch(/Cents/);
    }
    expect((await anonymous().get(`/api/builds/${handMade.id}/overview`)).status).toBe(401);
  });

  it('refuses a producer at once when the owner takes the role away (no stale person is reused)', async () => {
    const created = await owner
      .post('/api/users')
      .send({ name: 'Temp Producer', email: 'temp-producer@cedar-ridge.test', roles: ['producer'] });
    expect(created.status).toBe(201);
    const agent = await signInAs({ email: 'temp-producer@cedar-ridge.test', password: created.body.temporaryPassword });
    expect((await agent.get(`/api/builds/${handMade.id}/overview`)).status).toBe(200);
    expect((await owner.patch(`/api/users/${created.body.user.id}`).send({ roles: ['installer'] })).status).toBe(200);
    expect((await agent.get(`/api/builds/${handMade.id}/overview`)).status).toBe(403);
  });

  it('answers 404 for a build that does not exist', async () => {
    expect((await owner.get('/api/builds/999999/overview')).status).toBe(404);
    expect((await owner.get('/api/builds/abc/overview')).status).toBe(404);
  });

  it('agrees with the demo build’s rows in the database', async () => {
    const tern = await Build.findOne({ where: { slug: 'project-tern' } });
    expect(tern, 'the demo build is seeded').not.toBeNull();
    const res = await owner.get(`/api/builds/${tern!.id}/overview`);
    expect(res.status).toBe(200);
    const o = expandOverview(overviewAnswer.parse(res.body));
    expect(o.upgrades.length).toBeGreaterThan(0);
    expect(nonFinite(await buildOverview(tern!))).toEqual([]);
    await expectAgreesWithDatabase(o, tern!.id);
  });
});

/** The overview through the API, parsed with its contract (finite numbers only) and expanded as the client does. */
async function viaApi(b: Build): Promise<BuildOverview> {
  const res = await owner.get(`/api/builds/${b.id}/overview`);
  expect(res.status).toBe(200);
  return expandOverview(overviewAnswer.parse(res.body));
}

describe('builds with missing inputs show nulls, never NaN or Infinity', () => {
  it('a build with no upgrades at all', async () => {
    const b = await makeBuild();
    const o = await buildOverview(b);
    expect(nonFinite(o)).toEqual([]);
    expect(o.upgrades).toEqual([]);
    expect(o.headline).toMatchObject({
      netCents: 0,
      spentCents: 0,
      remainingCents: 1_000_000,
      valuePerDollar: null,
      upgradesTotal: 0,
      episodesTotal: 0,
    });
    expect(o.earnedValue).toMatchObject({
      bac: null,
      pv: 0,
      ev: 0,
      ac: 0,
      cpi: null,
      spi: null,
      eac: null,
      etc: null,
      vac: null,
      eacCpi: null,
      eacComposite: null,
    });
    expect(o.headline).toMatchObject({ forecastCents: null, bacCents: null, reserveCents: null, etcCents: null });
    expect(await viaApi(b)).toEqual(o);
  });

  it('a build with no budget', async () => {
    const b = await makeBuild({ budgetCents: null });
    const u = await upgrade(b.id, { title: 'Wireless charging pad', area: 'cabin', estimatedHours: 1 });
    await part(b.id, u.id, 1, 12_000);
    await labour(b.id, u.id, '2025-02-02', 1);
    const o = await buildOverview(b);
    expect(nonFinite(o)).toEqual([]);
    // The part is ordered, not fitted: it is not actual cost; the forecast still counts it.
    expect(o.headline).toMatchObject({
      budgetCents: null,
      remainingCents: null,
      spentShare: null,
      forecastCents: 20_550,
      forecastVarianceCents: null,
      reserveCents: null,
      netCents: 20_550,
      bacCents: 20_550,
    });
    expect(o.earnedValue).toMatchObject({ bac: 20_550, ev: 0, ac: 8_550, cpi: 0, eac: null, vac: null });
    expect(o.burndown).toEqual([]);
    expect(await viaApi(b)).toEqual(o);
  });

  it('a build with no labour rate', async () => {
    const b = await makeBuild({ labourRateCents: null });
    const u = await upgrade(b.id, { title: 'Rain-sensing wipers', area: 'front', estimatedHours: 2 });
    await labour(b.id, u.id, '2025-02-02', 3);
    await part(b.id, u.id, 1, 8_000);
    const o = await buildOverview(b);
    expect(nonFinite(o)).toEqual([]);
    expect(o.labourCosted).toBe(false);
    expect(o.upgrades[0]).toMatchObject({ labourCents: null, actualHours: 3, partsCents: 8_000, netCents: 8_000 });
    expect(o.totals.labourCents).toBeNull();
    expect(o.headline.actualHours).toBe(3);
    expect(o.headline).toMatchObject({
      forecastCents: null,
      etcCents: null,
      bacCents: null,
      reserveCents: null,
      remainingLabourCents: null,
    });
    expect(await viaApi(b)).toEqual(o);
  });

  it('a build whose upgrades are all estimated at zero hours', async () => {
    const b = await makeBuild({ budgetCents: 0 });
    await upgrade(b.id, { title: 'Auto-dimming mirror', area: 'cabin', estimatedHours: 0 });
    await upgrade(b.id, { title: 'Ambient lighting', area: 'electrical', estimatedHours: 0 });
    const o = await buildOverview(b);
    expect(nonFinite(o)).toEqual([]);
    expect(o.upgrades.every((u) => u.hoursRatio === null && u.valuePerDollar === null)).toBe(true);
    expect(o.totals.hoursRatio).toBeNull();
    expect(o.headline).toMatchObject({
      estimatedHours: 0,
      actualHours: 0,
      spentShare: null,
      bacCents: 0,
      reserveCents: 0,
      forecastCents: 0,
    });
    expect(o.earnedValue).toMatchObject({
      cpi: null,
      spi: null,
      eacCpi: null,
      eacComposite: null,
      tcpi: null,
      tcpiEac: null,
    });
    expect(await viaApi(b)).toEqual(o);
  });
});

describe('one round trip, whatever the size of the build', () => {
  it('runs the same number of queries for 1 and for 40 upgrades', async () => {
    const small = await makeBuild();
    const su = await upgrade(small.id, { title: 'Hitch', area: 'rear', estimatedHours: 2 });
    await part(small.id, su.id, 1, 100);
    await labour(small.id, su.id, '2025-02-03', 1);
    const big = await makeBuild();
    for (let i = 0; i < 40; i++) {
      const u = await upgrade(big.id, {
        title: `Upgrade ${i}`,
        area: i % 2 ? 'rear' : 'cabin',
        estimatedHours: 1 + (i % 3),
      });
      await part(big.id, u.id, 1 + (i % 2), 1_000 + i);
      await labour(big.id, u.id, `2025-02-${String(1 + (i % 28)).padStart(2, '0')}`, 0.5);
      await removed(big.id, u.id, 'sold', 100, 90, '2025-03-01');
    }
    const countFor = async (b: Build) => {
      const before = queryCounter.count;
      const res = await owner.get(`/api/builds/${b.id}/overview`);
      expect(res.status).toBe(200);
      return queryCounter.count - before;
    };
    const warmUp = await makeBuild();
    await countFor(warmUp); // the first request also opens the cache's listening connection
    const a = await countFor(small);
    const c = await countFor(big);
    // At most: the signed-in person (unless the 2-second person cache still holds them), the build,
    // the overview's one query — for 1 upgrade and for 40 alike (no query per upgrade).
    expect(a).toBeLessThanOrEqual(3);
    expect(c).toBeLessThanOrEqual(3);
    const before = queryCounter.count;
    await buildOverview(big);
    expect(queryCounter.count - before).toBe(1);
  });
});

describe('the cached overview', () => {
  const waitFor = async (check: () => Promise<boolean>) => {
    for (let i = 0; i < 50; i++) {
      if (await check()) return true;
      await new Promise((r) => setTimeout(r, 50));
    }
    return false;
  };

  it('answers a repeat request without computing again, and follows every change of the build', async () => {
    const b = await makeBuild();
    const u = await upgrade(b.id, { title: 'Running boards', area: 'sides', estimatedHours: 3 });
    await part(b.id, u.id, 1, 10_000);
    const url = `/api/builds/${b.id}/overview`;
    const first = await owner.get(url);
    expect(first.body.totals.partsCents).toBe(10_000);
    // Once the cache holds it, a repeat costs at most the session's person lookup.
    expect(
      await waitFor(async () => {
        const before = queryCounter.count;
        const again = await owner.get(url);
        return again.status === 200 && queryCounter.count - before <= 1 && again.body.totals.partsCents === 10_000;
      }),
    ).toBe(true);
    // The cached copy goes out gzipped to a client that accepts it (supertest unpacks it again).
    const zipped = await owner.get(url).set('Accept-Encoding', 'gzip');
    expect(zipped.headers['content-encoding']).toBe('gzip');
    expect(zipped.body.totals.partsCents).toBe(10_000);
    // A write anywhere in the build shows at once (the commit's notice drops the cached copy).
    await part(b.id, u.id, 2, 2_500);
    expect(await waitFor(async () => (await owner.get(url)).body.totals.partsCents === 15_000)).toBe(true);
    await labour(b.id, u.id, '2025-02-02', 2);
    expect(await waitFor(async () => (await owner.get(url)).body.totals.labourCents === 17_100)).toBe(true);
    await sequelize.query(`UPDATE builds SET budget_cents = 500000 WHERE id = $1`, { bind: [b.id] });
    expect(await waitFor(async () => (await owner.get(url)).body.headline.budgetCents === 500_000)).toBe(true);
    await sequelize.query(`DELETE FROM parts WHERE build_id = $1`, { bind: [b.id] });
    expect(await waitFor(async () => (await owner.get(url)).body.totals.partsCents === 0)).toBe(true);
    // A deleted build is gone from the cache too.
    await sequelize.query(`DELETE FROM builds WHERE id = $1`, { bind: [b.id] });
    expect(await waitFor(async () => (await owner.get(url)).status === 404)).toBe(true);
  });

  it('answers 304 to a client that already holds the same figures', async () => {
    const url = `/api/builds/${handMade.id}/overview`;
    const first = await owner.get(url);
    expect(first.headers.etag).toBeTruthy();
    const again = await owner.get(url).set('If-None-Match', first.headers.etag);
    expect(again.status).toBe(304);
  });

  it('computes once for concurrent misses of one build (single flight), and again after a change', async () => {
    let runs = 0;
    const compute = async () => {
      runs += 1;
      await new Promise((r) => setTimeout(r, 30));
      return { day: '2026-01-01', zone: 'UTC', body: Buffer.from('{}'), gzipped: null, etag: 'W/"x"' };
    };
    const same = await Promise.all(
      Array.from({ length: 8 }, () => singleFlight(424242, '1:0:0|2026-01-01|UTC', compute)),
    );
    expect(runs).toBe(1);
    expect(new Set(same).size).toBe(1);
    await singleFlight(424242, '1:0:1|2026-01-01|UTC', compute); // a change came in: a new stamp
    expect(runs).toBe(2);
    // Without the listening connection a reader never joins a computation already under way (it must
    // see its own write): the second waits for the next one (tests/api/overviewFlights.test.ts).
    await Promise.all([singleFlight(424242, '0:0:0|x', compute), singleFlight(424242, '0:0:0|x', compute)]);
    expect(runs).toBe(4);
    // A reader arriving while a computation runs joins it only when no change came in since it started.
    const running = singleFlight(515151, '1:0:3|2026-01-01|UTC', compute);
    expect(runningFor(515151, '1:0:3')).toBe(running);
    expect(runningFor(515151, '1:0:4')).toBeNull();
    expect(runningFor(515151, '0:0:3')).toBeNull();
    await running;
    expect(runningFor(515151, '1:0:3')).toBeNull();
  });

  it('answers ten concurrent requests after a change with one overview query', async () => {
    const b = await makeBuild();
    const u = await upgrade(b.id, { title: 'Tonneau cover', area: 'rear', estimatedHours: 2 });
    const url = `/api/builds/${b.id}/overview`;
    await owner.get(url); // opens the listening connection and caches
    await part(b.id, u.id, 1, 4_000);
    await new Promise((r) => setTimeout(r, 200)); // the change's notice drops the cached copy
    const before = queryCounter.count;
    const answers = await Promise.all(Array.from({ length: 10 }, () => owner.get(url)));
    expect(answers.every((a) => a.status === 200 && a.body.totals.partsCents === 4_000)).toBe(true);
    // Each request reads its person and (on a miss) the build; the overview's own query runs once.
    expect(queryCounter.count - before).toBeLessThanOrEqual(10 * 2 + 1);
  });
});

describe('a logged hour shows in the very next answer', () => {
  it('the cached overview drops its copy before the next read: no stale figure after a write', async () => {
    const b = await makeBuild();
    const u = await upgrade(b.id, { title: 'Bed liner', area: 'rear', estimatedHours: 4 });
    const url = `/api/builds/${b.id}/overview`;
    const read = async () => expandOverview(overviewAnswer.parse((await owner.get(url)).body));
    await read();
    const before = await read(); // now from the cache
    expect(before.upgrades[0]).toMatchObject({ actualHours: 0, labourCents: 0 });
    for (const [n, hours] of [
      [1, 1.5],
      [2, 2],
    ] as const) {
      const logged = await owner
        .post(`/api/builds/${b.id}/labour`)
        .send({ upgradeId: u.id, workedOn: '2025-02-03', hours, personName: 'Bay tech' });
      expect(logged.status).toBe(201);
      // By hand: $85.50/h × 1.5 h = $128.25; then 3.5 h = $299.25.
      const after = await read();
      expect(after.upgrades[0].actualHours, `after write ${n}`).toBe(n === 1 ? 1.5 : 3.5);
      expect(after.totals.labourCents).toBe(n === 1 ? 12_825 : 29_925);
      expect(after.headline.actualCents).toBe(n === 1 ? 12_825 : 29_925);
    }
  });

  it('after a logged hour re-reads only the labour sums; after any other change, everything', async () => {
    const b = await makeBuild();
    const u = await upgrade(b.id, { title: 'Roof rack', area: 'sides', estimatedHours: 2 });
    const url = `/api/builds/${b.id}/overview`;
    const read = async () => expandOverview(overviewAnswer.parse((await owner.get(url)).body));
    await read();
    await read();
    const reads = () => ({ ...overviewReads });
    let before = reads();
    expect(
      (
        await owner
          .post(`/api/builds/${b.id}/labour`)
          .send({ upgradeId: u.id, workedOn: '2025-02-04', hours: 2, personName: 'Bay tech' })
      ).status,
    ).toBe(201);
    // By hand: 2 h × $85.50 = $171.00.
    expect((await read()).totals).toMatchObject({ labourCents: 17_100, actualHours: 2 });
    expect(reads()).toEqual({ full: before.full, labour: before.labour + 1 });
    // A part is not labour: the next answer reads everything again, and shows it.
    before = reads();
    await part(b.id, u.id, 1, 4_200);
    expect((await read()).totals).toMatchObject({ partsCents: 4_200, labourCents: 17_100 });
    expect(reads().full).toBe(before.full + 1);
  });
});

describe('the overview contract', () => {
  it('travels compact and expands to exactly what the service computes; without money only names, dates and hours remain', async () => {
    const tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!;
    const res = await owner.get(`/api/builds/${tern.id}/overview`);
    const answer = overviewAnswer.parse(res.body);
    const expanded = expandOverview(answer);
    expect(expanded).toEqual(await buildOverview(tern));
    expect(compactOverview(expanded)).toEqual(answer);
    // No field a screen can work out travels: no net cost, value per dollar or hours ratio per row.
    expect(Object.keys(res.body.upgrades).sort()).toEqual([
      'actualHours',
      'done',
      'estimatedHours',
      'expectedRecoveryCents',
      'expensesCents',
      'labourCents',
      'partsCents',
      'recoveredCents',
      'title',
      'upgradeId',
      'valueAddedCents',
    ]);
    expect(res.body.totals).not.toHaveProperty('netCents');
    const bare = overviewAnswerWithoutMoney.parse(res.body);
    expect(JSON.stringify(bare)).not.toMatch(/Cents|valuePer|budget|labourRate|cpi|spi/i);
    expect(bare.upgrades.title).toEqual(answer.upgrades.title);
    expect(bare.headline.actualHours).toBe(answer.headline.actualHours);
  });
});
