// The overview's honest forecast (issue 12): the worked check through the API under both cost
// recognition settings, the demo build's forecast against its remaining work, and the build's clock.
import { describe, it, expect, beforeAll, afterEach, vi } from 'vitest';
import { QueryTypes } from 'sequelize';
import { signInAs } from '../helpers/api';
import { Build, Upgrade, sequelize } from '../../server/models';
import { buildOverview } from '../../server/services/overview';
import { expandOverview, type BuildOverview } from '../../shared/overview';
import { overviewAnswer } from '../../shared/contracts/overview';

let owner: Awaited<ReturnType<typeof signInAs>>;
let seq = 0;
const makeBuild = async (fields: Partial<Build> = {}) => {
  seq += 1;
  const b = await Build.create({
    slug: `forecast-${seq}`,
    name: `Forecast check ${seq}`,
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
    ...fields,
  } as never);
  return b.reload(); // the version and defaults as the database holds them
};
const upgrade = (buildId: number, f: Partial<Upgrade> & { title: string }) =>
  Upgrade.create({
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
async function part(
  buildId: number,
  upgradeId: number,
  cents: number,
  state: string,
  dates: { ordered?: string; received?: string } = {},
) {
  await sequelize.query(
    `INSERT INTO parts (build_id, upgrade_id, part_number, description, quantity, unit_cost_cents, state, ordered_on, received_on) VALUES ($1,$2,'TN-7','Kit',1,$3,$4,$5,$6)`,
    { bind: [buildId, upgradeId, cents, state, dates.ordered ?? null, dates.received ?? null] },
  );
}
const labour = (buildId: number, upgradeId: number, workedOn: string, hours: number) =>
  sequelize.query(
    `INSERT INTO labour_entries (build_id, upgrade_id, person_name, worked_on, hours) VALUES ($1,$2,'Bay tech',$3,$4)`,
    { bind: [buildId, upgradeId, workedOn, hours] },
  );

beforeAll(async () => {
  owner = await signInAs('owner');
});
afterEach(() => {
  vi.useRealTimers();
});

describe('the worked check of issue 12, through the API', () => {
  // By hand (the figures): budget $10,000, $100/h. A done: 10 h logged, $1,000 fitted.
  // B: 10 h, $3,000 received not fitted. C: 5 h, $500 not ordered. BAC $7,000, reserve $3,000.
  it('gives the same $7,000 headline at fitting and at receipt; only AC and the index figures move', async () => {
    const b = await makeBuild();
    const a = await upgrade(b.id, {
      title: 'A',
      estimatedHours: 10,
      installState: 'installed',
      installSegment: 'shot',
      demoSegment: 'shot',
      installedOn: '2026-02-10',
    });
    const bu = await upgrade(b.id, { title: 'B', estimatedHours: 10 });
    const c = await upgrade(b.id, { title: 'C', estimatedHours: 5 });
    await part(b.id, a.id, 100_000, 'fitted', { ordered: '2026-01-10', received: '2026-01-20' });
    await part(b.id, bu.id, 300_000, 'received', { ordered: '2026-01-10', received: '2026-01-22' });
    await part(b.id, c.id, 50_000, 'to_order');
    await labour(b.id, a.id, '2026-02-09', 10);
    const url = `/api/builds/${b.id}/overview`;

    const fit = expandOverview(overviewAnswer.parse((await owner.get(url)).body));
    expect(fit.headline).toMatchObject({
      bacCents: 700_000,
      reserveCents: 300_000,
      actualCents: 200_000,
      forecastCents: 700_000,
      costRecognition: 'fitting',
    });
    expect(fit.earnedValue).toMatchObject({ bac: 700_000, ev: 200_000, ac: 200_000, cpi: 1 });
    expect(fit.earnedValue.eacCpi).toBeCloseTo(700_000, 6);

    const patched = await owner.patch(`/api/builds/${b.id}`).send({ version: b.version, costRecognition: 'receipt' });
    expect(patched.status).toBe(200);
    expect(patched.body.build.costRecognition).toBe('receipt');
    const rec = (await buildOverview((await Build.findByPk(b.id))!)) as BuildOverview;
    expect(rec.headline).toMatchObject({ actualCents: 500_000, forecastCents: 700_000, costRecognition: 'receipt' });
    expect(rec.earnedValue.cpi).toBe(0.4);
    expect(rec.earnedValue.eacCpi).toBeCloseTo(1_750_000, 6); // BAC / CPI = 7,000 / 0.4 = 17,500
    // The cash view does not depend on the setting and sums to the roll-up to the cent.
    for (const o of [fit, rec])
      expect(o.headline.cash).toEqual({
        paidCents: 500_000,
        committedCents: 0,
        notOrderedCents: 50_000,
        netCents: 550_000,
      });
  });

  it('refuses a cost recognition that is not one of the two, and a producer setting it', async () => {
    const b = await makeBuild();
    const bad = await owner.patch(`/api/builds/${b.id}`).send({ version: b.version, costRecognition: 'ordered' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.map((f: { path: string }) => f.path)).toContain('costRecognition');
    const producer = await signInAs('producer');
    expect(
      (await producer.patch(`/api/builds/${b.id}`).send({ version: b.version, costRecognition: 'receipt' })).status,
    ).toBe(403);
    expect((await Build.findByPk(b.id))!.costRecognition).toBe('fitting');
  });
});

describe('the demo build', () => {
  it('forecasts its net cost plus its remaining hours at the rate, not an index projection', async () => {
    const tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!;
    expect(tern.timeZone).toBe('America/Denver');
    const o = await buildOverview(tern);
    const [{ left }] = await sequelize.query<{ left: number }>(
      `SELECT coalesce(sum(greatest(0, u.estimated_hours - coalesce((SELECT sum(hours) FROM labour_entries l WHERE l.upgrade_id = u.id), 0))), 0)::float8 AS left
         FROM upgrades u WHERE u.build_id = $1 AND u.install_state <> 'installed'`,
      { bind: [tern.id], type: QueryTypes.SELECT },
    );
    expect(o.headline.remainingHours).toBeCloseTo(left, 6);
    // Nothing of the demo is dated after today, so the forecast is every recorded dollar plus the hours left.
    expect(o.headline.forecastCents).toBe(o.headline.netCents + Math.round(left * 9_500));
    expect(o.headline.forecastCents!).toBeLessThan(o.headline.budgetCents!);
    expect(o.headline.bacCents! + o.headline.reserveCents!).toBe(o.headline.budgetCents);
    const c = o.headline.cash;
    expect(c.paidCents + c.committedCents + c.notOrderedCents).toBe(o.headline.netCents);
    const p = o.headline.pending;
    expect(
      o.headline.actualCents + p.receivedNotFittedCents + p.committedCents + p.notOrderedCents + p.laterDatedCents,
    ).toBe(o.headline.netCents);
    expect(o.earnedValue.ac).toBe(o.headline.actualCents);
    expect(o.burndown.at(-1)!.planned).toBe(o.headline.reserveCents);
  });
});

describe('the build’s own clock', () => {
  it('at 23:30 in Denver, with UTC already on the next day, today is still Denver’s day', async () => {
    // 2026-03-14 23:30 MDT (UTC−6) = 2026-03-15 05:30 UTC.
    vi.useFakeTimers({ toFake: ['Date'] });
    vi.setSystemTime(new Date('2026-03-15T05:30:00Z'));
    const denver = await makeBuild({ timeZone: 'America/Denver' } as Partial<Build>);
    const utc = await makeBuild({ timeZone: 'UTC' } as Partial<Build>);
    for (const b of [denver, utc]) {
      const u = await upgrade(b.id, { title: 'Late shift', estimatedHours: 4 });
      await labour(b.id, u.id, '2026-03-14', 1);
      await labour(b.id, u.id, '2026-03-15', 2);
    }
    const d = await buildOverview(denver);
    expect(d.asOf).toBe('2026-03-14');
    expect(d.timeZone).toBe('America/Denver');
    expect(d.headline.actualCents).toBe(10_000); // the hours dated the 15th are not worked yet in Denver
    expect(d.headline.pending.laterDatedCents).toBe(20_000);
    const u = await buildOverview(utc);
    expect(u.asOf).toBe('2026-03-15');
    expect(u.headline.actualCents).toBe(30_000);
    // The headline does not depend on the clock: 3 h logged + 1 h left, at $100.
    expect(d.headline.forecastCents).toBe(40_000);
    expect(u.headline.forecastCents).toBe(40_000);
  });

  it('refuses a time zone that is not an IANA name, naming the field, and changes nothing', async () => {
    const b = await makeBuild();
    for (const timeZone of ['Mountain Time', '+07:00', 'America/Nowhere', '']) {
      const res = await owner.patch(`/api/builds/${b.id}`).send({ version: b.version, timeZone });
      expect(res.status, timeZone).toBe(400);
      const f = res.body.error.fields.find((x: { path: string }) => x.path === 'timeZone');
      expect(f.message).toMatch(/IANA time zone/);
    }
    expect((await Build.findByPk(b.id))!.timeZone).toBe('UTC');
    const ok = await owner.patch(`/api/builds/${b.id}`).send({ version: b.version, timeZone: 'America/Denver' });
    expect(ok.status).toBe(200);
    expect(ok.body.build.timeZone).toBe('America/Denver');
  });
});
