// Earned value point figures against published worked examples; the burndown series on a hand-made build.
import { describe, expect, it } from 'vitest';
import { EV_CREDIT_RULES, earnedValue, earnedValueSeries, type EvSeriesInput } from '../../shared/earnedValue';
import { rollUpCosts } from '../../shared/costs';

describe('the index-based estimates at completion and the to-complete indices', () => {
  it('match the "EVM forecasting" poster of wikislate.com (poster 15, figures from poster 14)', () => {
    // Published: BAC 100, EV 40, AC 45 ($k), CPI 0.89, SPI 0.80 (so PV 50) → EAC = BAC/CPI $112.5k,
    // ETC $67.5k, VAC −$12.5k, EAC (cost × schedule) ≈ $129k, TCPI to BAC 1.09.
    const f = earnedValue({ bac: 100, pv: 50, ev: 40, ac: 45 });
    expect(f.cpi).toBeCloseTo(0.89, 2);
    expect(f.spi).toBeCloseTo(0.8, 12);
    expect(f.eacCpi).toBeCloseTo(112.5, 9);
    expect(f.etc).toBeCloseTo(67.5, 9);
    expect(f.vac).toBeCloseTo(-12.5, 9);
    // 45 + 60 / (0.8889 × 0.8) = 129.375: the poster prints it as "≈ 129".
    expect(f.eacComposite).toBeCloseTo(129.375, 9);
    expect(Math.round(f.eacComposite!)).toBe(129);
    expect(f.tcpi).toBeCloseTo(1.09, 2);
    // Not on the poster; the one-off formula on its figures, by hand: 45 + (100 − 40) = 105.
    expect(f.eacOneOff).toBe(105);
  });

  it('match the TCPI-against-EAC question discussed on pmzilla.com ("tcpi")', () => {
    // Published: AC $200,000, CV $25,000, BAC $350,000 → EV $225,000, CPI 1.125; with the one-off
    // EAC = AC + (BAC − EV) = $325,000 the TCPI against it is 1; with EAC = BAC / CPI (printed
    // rounded as $311,000) the TCPI is 1.125.
    const oneOff = earnedValue({ bac: 350_000, pv: null, ev: 225_000, ac: 200_000, eac: 325_000 });
    expect(oneOff.cpi).toBe(1.125);
    expect(oneOff.eacOneOff).toBe(325_000);
    expect(oneOff.tcpiEac).toBe(1);
    const typical = earnedValue({ bac: 350_000, pv: null, ev: 225_000, ac: 200_000 });
    // The page rounds EAC to $311,000 (125,000 / 111,000 = 1.126); the exact EAC 311,111.11 gives 1.125.
    expect(Math.abs(typical.eacCpi! - 311_000)).toBeLessThan(112);
    const withTypical = earnedValue({ bac: 350_000, pv: null, ev: 225_000, ac: 200_000, eac: typical.eacCpi });
    expect(withTypical.tcpiEac).toBeCloseTo(1.125, 9);
    expect(typical.eacComposite).toBeNull(); // no PV, so no SPI: that estimate cannot be made
  });

  it('allows the difference of a book that rounds CPI before dividing (Heldman-style exam text on gristprojectmanagement.us, "EAC using the CPI")', () => {
    // Published: BAC $500,000, EV $150,000, AC $162,000, "CPI is calculated as .93", EAC =
    // 162,000 + 350,000 / .93 = $538,344. Exact CPI is 0.925926, so EAC = AC + (BAC − EV) / CPI =
    // BAC / CPI = $540,000: the book's rounding of CPI to two places costs $1,656, which we allow.
    const f = earnedValue({ bac: 500_000, pv: null, ev: 150_000, ac: 162_000 });
    expect(f.cpi).toBeCloseTo(0.93, 2);
    expect(f.eacCpi).toBeCloseTo(540_000, 6);
    expect(Math.abs(f.eacCpi! - 538_344)).toBeLessThanOrEqual(1_656);
    expect(Math.round(162_000 + 350_000 / 0.93)).toBe(538_344); // the book's own arithmetic
  });

  it('leaves every estimate out (null) without a CPI, and TCPI against the estimate without one', () => {
    const f = earnedValue({ bac: 1000, pv: 0, ev: 0, ac: 0, eac: 0 });
    expect(f).toMatchObject({ eacCpi: null, eacComposite: null, eacOneOff: 1000, tcpiEac: null });
  });
});

describe('earnedValue point figures', () => {
  it('matches the four-sided fence exercise (Mulcahy, PMP Exam Prep, p. 210, via studylib "Earned Value Exercise")', () => {
    // Published: PV 3,000, EV 2,500, AC 2,800, BAC 4,000 → CV −300, CPI .893, SV −500, SPI .833,
    // EAC 4,479, ETC 1,679, VAC −479. The book rounds CPI to .893 before dividing, so its EAC, ETC
    // and VAC sit one dollar from the exact 4,480 / 1,680 / −480; we check within that dollar.
    const f = earnedValue({ bac: 4000, pv: 3000, ev: 2500, ac: 2800 });
    expect(f.cv).toBe(-300);
    expect(f.sv).toBe(-500);
    expect(f.cpi).toBeCloseTo(0.893, 3);
    expect(f.spi).toBeCloseTo(0.833, 3);
    expect(Math.abs(f.eac! - 4479)).toBeLessThanOrEqual(1);
    expect(Math.abs(f.etc! - 1679)).toBeLessThanOrEqual(1);
    expect(Math.abs(f.vac! - -479)).toBeLessThanOrEqual(1);
    expect(f.eac).toBeCloseTo(4480, 9); // exact: 4,000 × 2,800 / 2,500
    // Not in the exercise; the formula (BAC − EV) / (BAC − AC) on its figures: 1,500 / 1,200.
    expect(f.tcpi).toBeCloseTo(1.25, 12);
  });

  it('matches the one-task example of tutorialspoint "EVM example" for CV, SV, CPI, SPI', () => {
    // Published: PV $800, AC $1,100, EV $734 → SV −$66, SPI 0.91, CV −$366, CPI 0.66 (truncated).
    const f = earnedValue({ bac: 800, pv: 800, ev: 734, ac: 1100 });
    expect(f.sv).toBe(-66);
    expect(f.cv).toBe(-366);
    expect(Math.trunc(f.spi! * 100) / 100).toBe(0.91);
    expect(Math.trunc(f.cpi! * 100) / 100).toBe(0.66);
  });

  it('matches TCPI of the marketingskull.com "EVA concepts and formulas" example', () => {
    // Published: BAC 3,000, EV 1,560, AC 1,800 → work remaining 1,440, funds remaining 1,200, TCPI 1.2.
    expect(earnedValue({ bac: 3000, pv: null, ev: 1560, ac: 1800 }).tcpi).toBeCloseTo(1.2, 12);
  });

  it('gives null, never Infinity or NaN, on any division by zero, and propagates null', () => {
    expect(earnedValue({ bac: 1000, pv: 0, ev: 0, ac: 0 })).toEqual({
      cv: 0,
      sv: 0,
      cpi: null,
      spi: null,
      eac: null,
      etc: null,
      vac: null,
      tcpi: 1,
      eacCpi: null,
      eacOneOff: 1000,
      eacComposite: null,
      tcpiEac: null,
    });
    expect(earnedValue({ bac: 500, pv: 100, ev: 0, ac: 500 })).toMatchObject({
      cpi: 0,
      eac: null,
      etc: null,
      tcpi: null,
    });
    expect(earnedValue({ bac: null, pv: 100, ev: 50, ac: 40 })).toMatchObject({
      cv: 10,
      sv: -50,
      eac: null,
      vac: null,
      tcpi: null,
    });
    const all = Object.values(earnedValue({ bac: NaN, pv: Infinity, ev: 1, ac: 0 }));
    expect(all.every((v) => v === null || Number.isFinite(v))).toBe(true);
  });
});

// Rate $100/h. U1: 2 h + $50 parts = $250, shot 2025-01-10, done 2025-01-09. U2: 3 h = $300, shot
// 01-24. U3: 1 h + $100 parts = $200, shot 02-07. Budget $1,000 (so $250 of reserve).
const build = (rule?: EvSeriesInput['rule']): EvSeriesInput => ({
  bacCents: 100_000,
  labourRateCents: 10_000,
  rule,
  asOf: '2025-01-21',
  upgrades: [
    { id: 1, estimatedHours: 2, partsBudgetCents: 5_000, shootDate: '2025-01-10', doneOn: '2025-01-09' },
    { id: 2, estimatedHours: 3, partsBudgetCents: 0, shootDate: '2025-01-24', doneOn: null },
    { id: 3, estimatedHours: 1, partsBudgetCents: 10_000, shootDate: '2025-02-07', doneOn: null },
  ],
  labour: [
    { upgradeId: 1, workedOn: '2025-01-08', hours: 1.5 },
    { upgradeId: 1, workedOn: '2025-01-06', hours: 1 },
    { upgradeId: 2, workedOn: '2025-01-20', hours: 1 },
    { upgradeId: 2, workedOn: '2025-01-22', hours: 2 }, // after the status date: not yet actual
  ],
  expenses: [{ spentOn: '2025-01-07', amountCents: 1_234 }],
  parts: [
    { spentOn: '2025-01-03', costCents: 5_000 },
    { spentOn: null, costCents: 10_000 },
  ],
});

describe('earnedValueSeries', () => {
  it('places planned value on shoot dates, actual cost on spend dates, and 0/100 credit on done dates', () => {
    const s = earnedValueSeries(build());
    expect(s.points.map((p) => p.date)).toEqual([
      '2025-01-03',
      '2025-01-06',
      '2025-01-07',
      '2025-01-08',
      '2025-01-09',
      '2025-01-10',
      '2025-01-20',
      '2025-01-21',
      '2025-01-24',
      '2025-02-07',
    ]);
    const at = (d: string) => s.points.find((p) => p.date === d)!;
    expect(at('2025-01-08')).toEqual({
      date: '2025-01-08',
      planned: 0,
      earned: 0,
      actual: 31_234,
      remainingPlanned: 100_000,
      remainingActual: 68_766,
      forecast: null,
    });
    expect(at('2025-01-21')).toMatchObject({ planned: 25_000, earned: 25_000, actual: 41_234, forecast: 41_234 });
    expect(s.current).toMatchObject({ pv: 25_000, ev: 25_000, ac: 41_234, sv: 0, cv: -16_234 });
    // EAC = BAC / CPI = 100,000 × 41,234 / 25,000 = 164,936; 60 % of the remaining plan falls on 01-24.
    expect(at('2025-01-24')).toMatchObject({
      planned: 55_000,
      earned: null,
      actual: null,
      remainingActual: null,
      forecast: 115_455,
    });
    expect(at('2025-02-07')).toMatchObject({ planned: 75_000, remainingPlanned: 25_000, forecast: 164_936 });
    expect(s.forecastFinish).toBe('2025-02-07');
    expect(
      s.points.every((p) => Object.values(p).every((v) => v === null || typeof v === 'string' || Number.isInteger(v))),
    ).toBe(true);
  });

  it('credits 50/50 at first labour and at done, and percent of hours as they are logged', () => {
    expect(earnedValueSeries(build('50/50')).current.ev).toBe(12_500 + 12_500 + 15_000);
    const ph = earnedValueSeries(build('percent_hours'));
    // U1: 1 of 2 h on 01-06 → $125, 2.5 h on 01-08 caps at $250; U2: 1 of 3 h → $100.
    expect(ph.points.find((p) => p.date === '2025-01-06')!.earned).toBe(12_500);
    expect(ph.current.ev).toBe(35_000);
    expect(EV_CREDIT_RULES.map((r) => r.id)).toEqual(['0/100', '50/50', 'percent_hours']);
    expect(EV_CREDIT_RULES.every((r) => r.description.length > 10)).toBe(true);
  });

  it('costs labour as the cost roll-up does (per upgrade, rounded once), so both end on the same cents', () => {
    const labour = [
      { upgradeId: 7, workedOn: '2025-03-01', hours: 0.5 },
      { upgradeId: 7, workedOn: '2025-03-02', hours: 0.5 },
    ];
    const s = earnedValueSeries({
      bacCents: null,
      labourRateCents: 3_333,
      asOf: '2025-03-02',
      labour,
      expenses: [],
      parts: [],
      upgrades: [{ id: 7, estimatedHours: 1, partsBudgetCents: 0, shootDate: '2025-03-05', doneOn: null }],
    });
    const roll = rollUpCosts({
      labourRateCents: 3_333,
      parts: [],
      expenses: [],
      removedParts: [],
      labour,
      upgrades: [{ id: 7, area: 'cabin', episodeId: null, estimatedHours: 1, valueAddedCents: 0 }],
    });
    // 0.5 h → 1,666.5 ¢ → 1,667; at 1 h the upgrade costs 3,333 ¢, so the second day adds 1,666.
    expect(s.points.map((p) => p.actual)).toEqual([1_667, 3_333, null]);
    expect(s.current.ac).toBe(roll.build.labourCents);
    expect(s.bac).toBe(3_333); // no budget: BAC is the sum of budgeted cost
  });

  it('stretches the finish by SPI when the plan has no dates left, and leaves the forecast out without a CPI', () => {
    const s = earnedValueSeries({ ...build(), asOf: '2025-02-10' });
    // PV(asOf) = 75,000, EV = 25,000 → SPI 1/3; planned span 01-10 → 02-07 is 28 days → 84 days.
    expect(s.forecastFinish).toBe('2025-04-04');
    expect(s.points.at(-1)).toMatchObject({
      date: '2025-04-04',
      forecast: Math.round((100_000 * s.current.ac) / 25_000),
    });
    const none = earnedValueSeries({ ...build(), asOf: '2025-01-05' });
    expect(none.current.cpi).toBe(0);
    expect(none.points.every((p) => p.forecast === null)).toBe(true);
  });

  it('ends planned value at BAC, the sum of the upgrades’ budgeted cost, with unscheduled work on the plan’s end', () => {
    // By hand: 25,000 + 30,000 + 20,000 + U4 (2 h × $100 = 20,000, no shoot date) = 95,000.
    const input = build();
    input.bacCents = null;
    input.upgrades.push({ id: 4, estimatedHours: 2, partsBudgetCents: 0, shootDate: null, doneOn: null });
    const s = earnedValueSeries({ ...input, unscheduledOn: '2025-02-07' });
    expect(s.bac).toBe(95_000);
    expect(s.points.at(-1)!.planned).toBe(95_000);
    expect(s.unscheduledPlannedCents).toBe(20_000);
  });

  it('draws the forecast from the status date’s actual cost to the given estimate on the given finish', () => {
    const s = earnedValueSeries({
      ...build(),
      bacCents: null,
      forecast: { atCompletionCents: 90_000, finish: '2025-02-07' },
    });
    const at = (d: string) => s.points.find((p) => p.date === d)!;
    expect(at('2025-01-21').forecast).toBe(41_234);
    // 60 % of the plan after the status date falls on 01-24 (30,000 of 50,000): 41,234 + 0.6 × 48,766.
    expect(at('2025-01-24').forecast).toBe(70_494);
    expect(at('2025-02-07').forecast).toBe(90_000);
    expect(s.forecastFinish).toBe('2025-02-07');
  });
});
