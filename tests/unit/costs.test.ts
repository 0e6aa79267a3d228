// Cost roll-up on hand-made cases with exact cents, the rounding rule, and totals equal to the sum of rows.
import { describe, expect, it } from 'vitest';
import { rollUpCosts, roundHalfUpCents, type CostInput, type CostRow } from '../../shared/costs';
import type { Area, Disposition, PartState } from '../../shared/domain';
import { formatDollarsTick, formatLineTotal } from '../../src/theme';
import { recogniseCosts, type CostRecognition, type RecognitionInput } from '../../shared/costRecognition';
import { earnedValue } from '../../shared/earnedValue';

// Hand-made: rate $85.50/h. Every figure below is worked by hand from these lines.
const input: CostInput = {
  labourRateCents: 8_550,
  upgrades: [
    { id: 1, area: 'cabin', episodeId: 10, estimatedHours: 2, valueAddedCents: 40_000 },
    { id: 2, area: 'cabin', episodeId: 10, estimatedHours: 1.5, valueAddedCents: 0 },
    { id: 3, area: 'rear', episodeId: 11, estimatedHours: 3, valueAddedCents: 90_000 },
    { id: 4, area: 'front', episodeId: null, estimatedHours: 1, valueAddedCents: 5_000 },
  ],
  parts: [
    { upgradeId: 1, quantity: 2, unitCostCents: 1_999, state: 'ordered' }, // 3,998
    { upgradeId: 1, quantity: 1, unitCostCents: 500, state: 'returned' }, // excluded
    { upgradeId: 2, quantity: 1, unitCostCents: 12_000, state: 'received' },
    { upgradeId: 3, quantity: 4, unitCostCents: 2_550, state: 'fitted' }, // 10,200
    { upgradeId: 3, quantity: 1, unitCostCents: 100_000, state: 'returned' }, // excluded
  ],
  labour: [
    { upgradeId: 1, hours: 1.25 },
    { upgradeId: 1, hours: 0.5 }, // 1.75 h × 8,550 = 14,962.5 → 14,963
    { upgradeId: 2, hours: 0.47 }, // 4,018.5 (4018.4999999999995 in floats) → 4,019
    { upgradeId: 3, hours: 3.3 }, // 28,215
    { upgradeId: 99, hours: 1 }, // not an upgrade of the build: unassigned, 8,550
  ],
  expenses: [
    { upgradeId: 1, amountCents: 750 },
    { upgradeId: null, amountCents: 2_000 },
    { upgradeId: 3, amountCents: 300 },
  ],
  removedParts: [
    { upgradeId: 1, disposition: 'sold', expectedSaleCents: 3_000, actualSaleCents: 2_500 },
    { upgradeId: 1, disposition: 'for_sale', expectedSaleCents: 1_500, actualSaleCents: null },
    { upgradeId: 3, disposition: 'sold', expectedSaleCents: 900, actualSaleCents: null }, // no price recorded: 0
    { upgradeId: null, disposition: 'sold', expectedSaleCents: null, actualSaleCents: 4_000 },
    { upgradeId: 2, disposition: 'keep', expectedSaleCents: 7_000, actualSaleCents: null },
    { upgradeId: 3, disposition: 'scrapped', expectedSaleCents: 100, actualSaleCents: null },
  ],
};

const money = (r: CostRow) => [
  r.partsCents,
  r.labourCents,
  r.expensesCents,
  r.recoveredCents,
  r.expectedRecoveryCents,
  r.netCents,
  r.valueAddedCents,
];

describe('rollUpCosts', () => {
  const r = rollUpCosts(input);

  it('rolls each upgrade up to exact cents', () => {
    const row = (id: number) => r.upgrades.find((u) => u.upgradeId === id)!;
    expect(row(1)).toEqual({
      upgradeId: 1,
      partsCents: 3_998,
      labourCents: 14_963,
      expensesCents: 750,
      recoveredCents: 2_500,
      expectedRecoveryCents: 1_500,
      netCents: 17_211,
      estimatedHours: 2,
      actualHours: 1.75,
      valueAddedCents: 40_000,
      valuePerDollar: 40_000 / 17_211,
    });
    expect(money(row(2))).toEqual([12_000, 4_019, 0, 0, 0, 16_019, 0]);
    expect(row(2).valuePerDollar).toBe(0);
    expect(money(row(3))).toEqual([10_200, 28_215, 300, 0, 0, 38_715, 90_000]);
    expect(row(4)).toMatchObject({ netCents: 0, actualHours: 0, valuePerDollar: null });
  });

  it('keeps money on no upgrade in the unassigned bucket and the build total', () => {
    expect(money(r.unassigned)).toEqual([0, 8_550, 2_000, 4_000, 0, 6_550, 0]);
    expect(money(r.build)).toEqual([26_198, 55_747, 3_050, 6_500, 1_500, 78_495, 135_000]);
    expect(r.build.estimatedHours).toBe(7.5);
    expect(r.build.actualHours).toBeCloseTo(6.52, 9);
    expect(r.build.valuePerDollar).toBeCloseTo(135_000 / 78_495, 12);
  });

  it('groups by area (in AREAS order) and by episode (unscheduled last)', () => {
    expect(r.areas.map((a) => a.area)).toEqual(['front', 'rear', 'cabin']);
    expect(money(r.areas[2])).toEqual([15_998, 18_982, 750, 2_500, 1_500, 33_230, 40_000]);
    expect(r.episodes.map((e) => e.episodeId)).toEqual([10, 11, null]);
    expect(r.episodes[0].netCents).toBe(33_230);
  });

  it('gives no value per dollar when net cost is zero or negative (recoveries exceed spending)', () => {
    const only = rollUpCosts({
      labourRateCents: 1_000,
      parts: [],
      labour: [],
      expenses: [],
      upgrades: [{ id: 1, area: 'wheels_chassis', episodeId: 1, estimatedHours: 4, valueAddedCents: 100 }],
      removedParts: [{ upgradeId: 1, disposition: 'sold', expectedSaleCents: null, actualSaleCents: 60_000 }],
    });
    expect(only.upgrades[0]).toMatchObject({ netCents: -60_000, valuePerDollar: null });
  });
});

describe('roundHalfUpCents (labour rounding rule)', () => {
  it('rounds halves up, mirrors them below zero, and ignores float noise', () => {
    expect([0.5, 1.5, 2.5, 14_962.5, 0.49, -0.5, -2.5, 0].map(roundHalfUpCents)).toEqual([
      1, 2, 3, 14_963, 0, -1, -3, 0,
    ]);
    expect(0.47 * 8_550).toBeLessThan(4_018.5); // the float product falls short of the half…
    expect(roundHalfUpCents(0.47 * 8_550)).toBe(4_019); // …yet rounds as the decimal 4,018.5 does
    expect(roundHalfUpCents((0.1 + 0.2) * 8_550)).toBe(2_565);
    expect(Object.is(roundHalfUpCents(-0.2), 0)).toBe(true);
  });

  it('rounds once per upgrade on its summed hours, not per entry', () => {
    const r = rollUpCosts({
      labourRateCents: 3_333,
      parts: [],
      expenses: [],
      removedParts: [],
      upgrades: [{ id: 1, area: 'cabin', episodeId: null, estimatedHours: 1, valueAddedCents: 0 }],
      labour: [
        { upgradeId: 1, hours: 0.5 },
        { upgradeId: 1, hours: 0.5 },
      ],
    });
    expect(r.upgrades[0].labourCents).toBe(3_333); // per entry it would be 1,667 + 1,667 = 3,334
  });
});

describe('totals equal the sum of rows, to the cent, on random builds', () => {
  let seed = 7;
  const rand = () => (seed = (seed * 1_103_515_245 + 12_345) % 2_147_483_648) / 2_147_483_648;
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(rand() * xs.length)];
  const areas: Area[] = ['front', 'sides', 'rear', 'cabin', 'electrical', 'wheels_chassis'];
  const states: PartState[] = ['to_order', 'ordered', 'backordered', 'received', 'fitted', 'returned'];
  const dispositions: Disposition[] = ['keep', 'for_sale', 'sold', 'scrapped'];

  it('holds for build = Σ upgrades + unassigned = Σ areas + unassigned = Σ episodes + unassigned', () => {
    for (let round = 0; round < 50; round++) {
      const ids = Array.from({ length: 1 + Math.floor(rand() * 30) }, (_, i) => i + 1);
      const maybe = () => (rand() < 0.2 ? null : pick(ids));
      const r = rollUpCosts({
        labourRateCents: 1 + Math.floor(rand() * 20_000),
        upgrades: ids.map((id) => ({
          id,
          area: pick(areas),
          episodeId: rand() < 0.3 ? null : 1 + Math.floor(rand() * 5),
          estimatedHours: Math.round(rand() * 4000) / 100,
          valueAddedCents: Math.floor(rand() * 200_000),
        })),
        parts: Array.from({ length: 40 }, () => ({
          upgradeId: pick(ids),
          quantity: 1 + Math.floor(rand() * 4),
          unitCostCents: Math.floor(rand() * 90_000),
          state: pick(states),
        })),
        labour: Array.from({ length: 60 }, () => ({ upgradeId: pick(ids), hours: Math.round(rand() * 800) / 100 })),
        expenses: Array.from({ length: 15 }, () => ({ upgradeId: maybe(), amountCents: Math.floor(rand() * 30_000) })),
        removedParts: Array.from({ length: 10 }, () => ({
          upgradeId: maybe(),
          disposition: pick(dispositions),
          expectedSaleCents: Math.floor(rand() * 50_000),
          actualSaleCents: rand() < 0.2 ? null : Math.floor(rand() * 50_000),
        })),
      });
      const sum = (rows: CostRow[]) =>
        rows.reduce((acc, row) => acc.map((v, i) => v + money(row)[i]), money(r.unassigned));
      expect(sum(r.upgrades)).toEqual(money(r.build));
      expect(sum(r.areas)).toEqual(money(r.build));
      expect(sum(r.episodes)).toEqual(money(r.build));
      expect(money(r.build).every(Number.isInteger)).toBe(true);
    }
  });
});

// When material cost is recognised. EIA-748-D, Guideline 21 (as quoted by Humphreys & Associates,
// "Earning Value for Material – The Correct Approach, Part 2"): material earned value is taken at the
// point most suitable for the category of material, and no earlier than its receipt. Humphreys &
// Associates, "Aligning BCWP with ACWP for Proper EVM" (2013): under that guideline actual cost of
// material is not to enter the earned-value figures before its earned value does — costs held in
// stock wait until the material is issued. Hence "at fitting" (the default: cost and earned value of
// a part land on the same work) and "at receipt" (the earliest point the guideline allows).
describe('cost recognition, the cash view and the bottom-up forecast (issue 12 worked check)', () => {
  // By hand, from the issue: budget $10,000, labour $100/h. A done: 10 h estimated and logged,
  // $1,000 of parts fitted. B not started: 10 h, $3,000 of parts received, not fitted. C not
  // started: 5 h, $500 of parts not yet ordered. BAC = 2,000 + 4,000 + 1,000 = $7,000.
  const check = (recognition: CostRecognition): RecognitionInput => ({
    recognition,
    asOf: '2026-03-10',
    labourRateCents: 10_000,
    upgrades: [
      { id: 1, estimatedHours: 10, installState: 'installed', installedOn: '2026-03-05', done: true },
      { id: 2, estimatedHours: 10, installState: 'queued', installedOn: null, done: false },
      { id: 3, estimatedHours: 5, installState: 'queued', installedOn: null, done: false },
    ],
    parts: [
      {
        upgradeId: 1,
        state: 'fitted',
        cents: 100_000,
        orderedOn: '2026-02-01',
        receivedOn: '2026-02-10',
        fittedOn: '2026-03-04',
      },
      {
        upgradeId: 2,
        state: 'received',
        cents: 300_000,
        orderedOn: '2026-02-01',
        receivedOn: '2026-02-12',
        fittedOn: null,
      },
      { upgradeId: 3, state: 'to_order', cents: 50_000, orderedOn: null, receivedOn: null, fittedOn: null },
    ],
    labour: [{ upgradeId: 1, workedOn: '2026-03-03', hours: 10 }],
    expenses: [],
    recoveries: [],
  });
  const ev = (ac: number) => earnedValue({ bac: 700_000, pv: 700_000, ev: 200_000, ac });

  it('at fitting: AC $2,000, CPI 1, forecast $7,000', () => {
    const r = recogniseCosts(check('fitting'));
    expect(r.actualCents).toBe(200_000);
    expect(r.forecast.atCompletionCents).toBe(700_000); // 2,000 + (1,000 + 3,000) + (500 + 500)
    expect(r.forecast.upgrades.map((u) => u.etcCents)).toEqual([0, 400_000, 100_000]);
    expect(ev(r.actualCents).cpi).toBe(1);
    expect(r.partDates).toEqual(['2026-03-04', null, null]);
  });

  it('at receipt: AC $5,000, CPI 0.4, BAC / CPI $17,500, and the forecast is still $7,000', () => {
    const r = recogniseCosts(check('receipt'));
    expect(r.actualCents).toBe(500_000);
    expect(ev(r.actualCents).cpi).toBe(0.4);
    expect(ev(r.actualCents).eacCpi).toBeCloseTo(1_750_000, 6);
    expect(r.forecast.atCompletionCents).toBe(700_000);
    expect(r.partDates).toEqual(['2026-02-10', '2026-02-12', null]);
  });

  it('the cash view and the recognised view both sum to the roll-up’s net cost, to the cent', () => {
    for (const mode of ['fitting', 'receipt'] as const) {
      const r = recogniseCosts(check(mode));
      // Paid: 1,000 labour + 1,000 + 3,000 parts in hand; nothing ordered and waiting; 500 not ordered.
      expect(r.cash).toEqual({ paidCents: 500_000, committedCents: 0, notOrderedCents: 50_000, netCents: 550_000 });
      const p = r.pending;
      expect(r.actualCents + p.receivedNotFittedCents + p.committedCents + p.notOrderedCents + p.laterDatedCents).toBe(
        550_000,
      );
      expect(r.netCents).toBe(550_000);
    }
  });

  it('money dated after the status date is planned, not actual, and still in the forecast', () => {
    const input = check('fitting');
    input.labour.push({ upgradeId: 2, workedOn: '2026-03-11', hours: 1.5 });
    input.expenses.push({ upgradeId: 2, spentOn: '2026-03-20', cents: 2_500 });
    input.parts.push({
      upgradeId: 2,
      state: 'ordered',
      cents: 7_000,
      orderedOn: '2026-03-09',
      receivedOn: null,
      fittedOn: null,
    });
    const r = recogniseCosts(input);
    expect(r.actualCents).toBe(200_000);
    // B: 8.5 h left × $100 = 850 + 1.5 h dated later 150 + expense 25 + parts 3,000 + 70.
    expect(r.forecast.upgrades[1]).toMatchObject({
      remainingHours: 8.5,
      labourCents: 85_000,
      plannedCents: 17_500,
      partsCents: 307_000,
    });
    expect(r.forecast.atCompletionCents).toBe(200_000 + 85_000 + 17_500 + 307_000 + 100_000);
    expect(r.cash).toEqual({
      paidCents: 500_000,
      committedCents: 7_000 + 17_500,
      notOrderedCents: 50_000,
      netCents: 574_500,
    });
  });
});

describe('money as the screens write it', () => {
  it('writes axis ticks with a true minus sign before the dollar sign', () => {
    expect(formatDollarsTick(-1_000_000 / 100)).toBe('−$10,000');
    expect(formatDollarsTick(25_000)).toBe('$25,000');
    expect(formatDollarsTick(0)).toBe('$0');
  });
  it('writes a parts line as quantity × unit price = line total', () => {
    expect(formatLineTotal(4, 18_500)).toBe('4 × $185.00 = $740.00');
    expect(formatLineTotal(1, 18_500)).toBe('$185.00');
    expect(formatLineTotal(3, null)).toBe('—');
  });
});

describe('the estimate to complete of an installed upgrade', () => {
  it('has no bay hours left once installed, even when fewer hours were logged than estimated', () => {
    // By hand: 6 h estimated, 4 h logged, installed (segments not shot): 0 h left; queued twin: 2 h × $100.
    const r = recogniseCosts({
      recognition: 'fitting',
      asOf: '2026-05-01',
      labourRateCents: 10_000,
      upgrades: [
        { id: 1, estimatedHours: 6, installState: 'installed', installedOn: '2026-04-20', done: false },
        { id: 2, estimatedHours: 6, installState: 'queued', installedOn: null, done: false },
      ],
      parts: [],
      expenses: [],
      recoveries: [],
      labour: [
        { upgradeId: 1, workedOn: '2026-04-19', hours: 4 },
        { upgradeId: 2, workedOn: '2026-04-19', hours: 4 },
      ],
    });
    expect(r.forecast.upgrades.map((u) => u.remainingHours)).toEqual([0, 2]);
    expect(r.forecast.atCompletionCents).toBe(80_000 + 20_000);
  });
});
