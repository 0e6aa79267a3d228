// Earned value point figures against published worked examples; the burndown series on a hand-made build.
import { describe, expect, it } from 'vitest';
import { EV_CREDIT_RULES, earnedValue, earnedValueSeries, type EvSeriesInput } from '../../shared/earnedValue';
import { rollUpCosts } from '../../shared/costs';

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
      cv: 0, sv: 0, cpi: null, spi: null, eac: null, etc: null, vac: null, tcpi: 1,
    });
    expect(earnedValue({ bac: 500, pv: 100, ev: 0, ac: 500 })).toMatchObject({ cpi: 0, eac: null, etc: null, tcpi: null });
    expect(earnedValue({ bac: null, pv: 100, ev: 50, ac: 40 })).toMatchObject({ cv: 10, sv: -50, eac: null, vac: null, tcpi: null });
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
      '2025-01-03', '2025-01-06', '2025-01-07', '2025-01-08', '2025-01-09', '2025-01-10', '2025-01-20', '2025-01-21',
      '2025-01-24', '2025-02-07',
    ]);
    const at = (d: string) => s.points.find((p) => p.date === d)!;
    expect(at('2025-01-08')).toEqual({
      date: '2025-01-08', planned: 0, earned: 0, actual: 31_234, remainingPlanned: 100_000, remainingActual: 68_766, forecast: null,
    });
    expect(at('2025-01-21')).toMatchObject({ planned: 25_000, earned: 25_000, actual: 41_234, forecast: 41_234 });
    expect(s.current).toMatchObject({ pv: 25_000, ev: 25_000, ac: 41_234, sv: 0, cv: -16_234 });
    // EAC = BAC / CPI = 100,000 × 41,234 / 25,000 = 164,936; 60 % of the remaining plan falls on 01-24.
    expect(at('2025-01-24')).toMatchObject({ planned: 55_000, earned: null, actual: null, remainingActual: null, forecast: 115_455 });
    expect(at('2025-02-07')).toMatchObject({ planned: 75_000, remainingPlanned: 25_000, forecast: 164_936 });
    expect(s.forecastFinish).toBe('2025-02-07');
    expect(s.points.every((p) => Object.values(p).every((v) => v === null || typeof v === 'string' || Number.isInteger(v)))).toBe(true);
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
      bacCents: null, labourRateCents: 3_333, asOf: '2025-03-02', labour, expenses: [], parts: [],
      upgrades: [{ id: 7, estimatedHours: 1, partsBudgetCents: 0, shootDate: '2025-03-05', doneOn: null }],
    });
    const roll = rollUpCosts({
      labourRateCents: 3_333, parts: [], expenses: [], removedParts: [], labour,
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
    expect(s.points.at(-1)).toMatchObject({ date: '2025-04-04', forecast: Math.round(100_000 * s.current.ac / 25_000) });
    const none = earnedValueSeries({ ...build(), asOf: '2025-01-05' });
    expect(none.current.cpi).toBe(0);
    expect(none.points.every((p) => p.forecast === null)).toBe(true);
  });
});
