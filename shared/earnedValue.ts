// Earned value (DESIGN §4.2): the standard point figures and the burndown series, in integer cents.
import { roundHalfUpCents } from './costs';
import { addDays, daysBetween } from './dates';

export interface EarnedValueInput {
  bac: number | null;
  pv: number | null;
  ev: number | null;
  ac: number | null;
  /** The headline (bottom-up) estimate at completion, for the to-complete index against it. */
  eac?: number | null;
}

export interface EarnedValueFigures {
  cv: number | null;
  sv: number | null;
  cpi: number | null;
  spi: number | null;
  eac: number | null;
  etc: number | null;
  vac: number | null;
  tcpi: number | null;
  /** EAC = BAC / CPI: the cost performance so far continues. */
  eacCpi: number | null;
  /** EAC = AC + (BAC − EV): the variance so far was one-off; the rest goes as budgeted. */
  eacOneOff: number | null;
  /** EAC = AC + (BAC − EV) / (CPI × SPI): cost and schedule performance both weigh on the rest. */
  eacComposite: number | null;
  /** TCPI = (BAC − EV) / (EAC − AC) against the headline estimate; null without one. */
  tcpiEac: number | null;
}

type N = number | null | undefined;
const val = (x: N): number | null => (typeof x === 'number' && Number.isFinite(x) ? x : null);
const sub = (a: N, b: N) => (val(a) === null || val(b) === null ? null : (a as number) - (b as number));
const div = (a: N, b: N) => (val(a) === null || val(b) === null || b === 0 ? null : (a as number) / (b as number));

/**
 * CV = EV − AC, SV = EV − PV, CPI = EV / AC, SPI = EV / PV, EAC = BAC / CPI, ETC = EAC − AC,
 * VAC = BAC − EAC, TCPI = (BAC − EV) / (BAC − AC) (the to-complete index against the budget).
 * A missing input or a division by zero gives null, and null propagates; never Infinity or NaN.
 */
export function earnedValue({ bac, pv, ev, ac, eac: headline }: EarnedValueInput): EarnedValueFigures {
  const cpi = div(ev, ac);
  const spi = div(ev, pv);
  const eac = div(bac, cpi);
  const workLeft = sub(bac, ev);
  const cpiSpi = cpi === null || spi === null ? null : cpi * spi;
  const oneOff = val(ac) === null || workLeft === null ? null : (ac as number) + workLeft;
  const composite = div(workLeft, cpiSpi);
  return {
    eacCpi: eac,
    eacOneOff: oneOff,
    eacComposite: composite === null || val(ac) === null ? null : (ac as number) + composite,
    tcpiEac: div(workLeft, sub(headline, ac)),
    cv: sub(ev, ac),
    sv: sub(ev, pv),
    cpi,
    spi,
    eac,
    etc: sub(eac, ac),
    vac: sub(bac, eac),
    tcpi: div(sub(bac, ev), sub(bac, ac)),
  };
}

export const EV_CREDIT_RULES = [
  { id: '0/100', label: '0/100', description: 'Nothing is earned until an upgrade is done; then its whole budget is.' },
  {
    id: '50/50',
    label: '50/50',
    description: 'Half of an upgrade’s budget is earned when work starts, the other half when it is done.',
  },
  {
    id: 'percent_hours',
    label: 'Percent of hours',
    description: 'Budget is earned as hours are logged against the estimate (never past 100 %); the rest when done.',
  },
] as const;
export type EvCreditRule = (typeof EV_CREDIT_RULES)[number]['id'];

export interface EvSeriesInput {
  /** Budget at completion: the build budget. Null: the sum of the upgrades' budgeted cost. */
  bacCents: number | null;
  labourRateCents: number;
  rule?: EvCreditRule;
  /** Status date; events after it are not yet actual. Default: the latest dated actual or earned event. */
  asOf?: string | null;
  upgrades: {
    id: number;
    estimatedHours: number;
    /** Budgeted parts cost of the upgrade (its part lines, returned ones excluded). */
    partsBudgetCents: number;
    /** Shoot date of its episode: where its planned value falls. Null: not scheduled. */
    shootDate: string | null;
    /** The day it became done (installed and both segments shot); null while not done. */
    doneOn: string | null;
    /** The day work started (for 50/50); default its first labour date. */
    startedOn?: string | null;
  }[];
  labour: { upgradeId: number | null; workedOn: string; hours: number }[];
  expenses: { spentOn: string; amountCents: number }[];
  /** Part cost on the day it was spent (ordered or paid: the caller's choice); undated parts are not spent yet. */
  parts: { spentOn: string | null; costCents: number }[];
  /** Sales of removed parts, which reduce actual cost on the day sold. */
  recoveries?: { soldOn: string; amountCents: number }[];
  /** Where the planned value of upgrades with no shoot date falls (the plan's end), so that PV ends at BAC. */
  unscheduledOn?: string | null;
  /**
   * The forecast line: from the status date's actual cost to this estimate at completion on this
   * finish date. Without it the line follows the current CPI (EAC = BAC / CPI).
   */
  forecast?: { atCompletionCents: number | null; finish: string | null };
}

export interface EvPoint {
  date: string;
  planned: number;
  /** Null after the status date. */
  earned: number | null;
  actual: number | null;
  remainingPlanned: number;
  remainingActual: number | null;
  /** From the status date's actual cost to EAC, following the remaining plan's shape; null before it. */
  forecast: number | null;
}

export interface EvSeries {
  rule: EvCreditRule;
  bac: number;
  asOf: string | null;
  /** Planned value of upgrades with no shoot date: in BAC (when BAC defaults) but on no date. */
  unscheduledPlannedCents: number;
  points: EvPoint[];
  /** Cumulative PV, EV and AC at the status date with the point figures. */
  current: EarnedValueFigures & { pv: number; ev: number; ac: number };
  /** Date the forecast line reaches EAC; null when it cannot be drawn. */
  forecastFinish: string | null;
}

const dayAdd = addDays;
const dayDiff = daysBetween;

class Ledger {
  readonly byDate = new Map<string, number>();
  add(date: string, cents: number) {
    if (cents !== 0) this.byDate.set(date, (this.byDate.get(date) ?? 0) + cents);
    else if (!this.byDate.has(date)) this.byDate.set(date, 0);
  }
  /** Cumulative totals at each of `dates` (sorted), counting entries on or before each. */
  cumulative(dates: readonly string[]): number[] {
    const entries = [...this.byDate.entries()].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    const out: number[] = [];
    let k = 0;
    let sum = 0;
    for (const d of dates) {
      while (k < entries.length && entries[k][0] <= d) sum += entries[k++][1];
      out.push(sum);
    }
    return out;
  }
}

/**
 * Budgeted cost of an upgrade = estimated hours × labour rate (rounded half-up to the cent) + its
 * budgeted parts cost; all of it is planned on its episode's shoot date. Earned value follows the
 * credit rule. Actual labour is costed as costs.ts does — per upgrade, on its running hours, rounded
 * once — so the series ends on the same cents as the cost roll-up.
 */
export function earnedValueSeries(input: EvSeriesInput): EvSeries {
  const rule: EvCreditRule = input.rule ?? '0/100';
  const rate = input.labourRateCents;
  const budget = new Map<number, number>();
  const planned = new Ledger();
  let total = 0;
  let unscheduled = 0;
  for (const u of input.upgrades) {
    if (budget.has(u.id)) continue;
    const b = roundHalfUpCents(u.estimatedHours * rate) + (u.partsBudgetCents ?? 0);
    budget.set(u.id, b);
    total += b;
    if (u.shootDate) planned.add(u.shootDate, b);
    else {
      unscheduled += b;
      if (input.unscheduledOn) planned.add(input.unscheduledOn, b);
    }
  }
  const bac = val(input.bacCents) ?? total;

  const labour = [...input.labour].sort((a, b) => (a.workedOn < b.workedOn ? -1 : a.workedOn > b.workedOn ? 1 : 0));
  let asOf = input.asOf ?? null;
  if (!asOf) {
    const dates = [
      ...labour.map((l) => l.workedOn),
      ...input.expenses.map((e) => e.spentOn),
      ...input.parts.map((p) => p.spentOn),
      ...(input.recoveries ?? []).map((r) => r.soldOn),
      ...input.upgrades.flatMap((u) => [u.doneOn, u.startedOn ?? null]),
    ].filter((d): d is string => !!d);
    asOf = dates.length ? dates.reduce((a, b) => (b > a ? b : a)) : null;
  }
  const upTo = (d: string | null | undefined): d is string => !!d && !!asOf && d <= asOf;

  // Actual cost. Labour: the upgrade's labour cost is re-rounded on its running hours at each entry.
  const actual = new Ledger();
  const hoursSoFar = new Map<number | null, number>();
  const centsSoFar = new Map<number | null, number>();
  const firstLabour = new Map<number, string>();
  const labourByUpgrade = new Map<number, { date: string; hours: number }[]>();
  for (const l of labour) {
    if (l.upgradeId != null) {
      if (!firstLabour.has(l.upgradeId)) firstLabour.set(l.upgradeId, l.workedOn);
      if (!labourByUpgrade.has(l.upgradeId)) labourByUpgrade.set(l.upgradeId, []);
      labourByUpgrade.get(l.upgradeId)!.push({ date: l.workedOn, hours: l.hours });
    }
    if (!upTo(l.workedOn)) continue;
    const h = (hoursSoFar.get(l.upgradeId) ?? 0) + l.hours;
    const c = roundHalfUpCents(h * rate);
    actual.add(l.workedOn, c - (centsSoFar.get(l.upgradeId) ?? 0));
    hoursSoFar.set(l.upgradeId, h);
    centsSoFar.set(l.upgradeId, c);
  }
  for (const e of input.expenses) if (upTo(e.spentOn)) actual.add(e.spentOn, e.amountCents);
  for (const p of input.parts) if (upTo(p.spentOn)) actual.add(p.spentOn, p.costCents);
  for (const r of input.recoveries ?? []) if (upTo(r.soldOn)) actual.add(r.soldOn, -r.amountCents);

  const earned = new Ledger();
  for (const u of input.upgrades) {
    const b = budget.get(u.id)!;
    if (rule === '0/100') {
      if (upTo(u.doneOn)) earned.add(u.doneOn, b);
    } else if (rule === '50/50') {
      const start = u.startedOn ?? firstLabour.get(u.id) ?? u.doneOn;
      const half = Math.floor(b / 2);
      if (upTo(start)) earned.add(start, half);
      if (upTo(u.doneOn)) earned.add(u.doneOn, b - half);
    } else {
      let credited = 0;
      let h = 0;
      for (const l of labourByUpgrade.get(u.id) ?? []) {
        if (!upTo(l.date) || (u.doneOn && l.date > u.doneOn)) continue;
        h += l.hours;
        const share = u.estimatedHours > 0 ? Math.min(1, Math.max(0, h / u.estimatedHours)) : 0;
        const target = roundHalfUpCents(b * share);
        earned.add(l.date, target - credited);
        credited = target;
      }
      if (upTo(u.doneOn)) earned.add(u.doneOn, b - credited);
    }
  }

  return assemble(rule, bac, asOf, unscheduled, planned, earned, actual, input.forecast);
}

function assemble(
  rule: EvCreditRule,
  bac: number,
  asOf: string | null,
  unscheduled: number,
  planned: Ledger,
  earned: Ledger,
  actual: Ledger,
  given?: EvSeriesInput['forecast'],
): EvSeries {
  const pastDates = new Set<string>([...earned.byDate.keys(), ...actual.byDate.keys()]);
  if (asOf) pastDates.add(asOf);
  const plannedDates = [...planned.byDate.keys()].sort();
  const base = [...new Set([...plannedDates, ...pastDates])].sort();
  const [pvAsOf] = asOf ? planned.cumulative([asOf]) : [0];
  const [ev0] = asOf ? earned.cumulative([asOf]) : [0];
  const [ac0] = asOf ? actual.cumulative([asOf]) : [0];
  const figures = earnedValue({ bac, pv: pvAsOf, ev: ev0, ac: ac0 });

  // Forecast: the remaining budgeted work (BAC − EV) at the current CPI, spread over the dates the
  // plan still has after the status date. With no such dates (the plan is overdue), the finish is
  // the planned duration stretched by SPI, the usual independent estimate of completion time.
  const cpi = asOf ? figures.cpi : null;
  let forecastFinish: string | null = null;
  const futurePlanned = asOf ? plannedDates.filter((d) => d > asOf) : [];
  const remainingWork = Math.max(0, bac - ev0);
  const dates = [...base];
  if (!given && asOf && cpi !== null && cpi > 0) {
    if (remainingWork === 0) forecastFinish = asOf;
    else if (futurePlanned.length) forecastFinish = futurePlanned[futurePlanned.length - 1];
    else if (plannedDates.length && figures.spi) {
      const span = dayDiff(plannedDates[0], plannedDates[plannedDates.length - 1]);
      const stretched = dayAdd(plannedDates[0], Math.ceil(span / figures.spi - 1e-9));
      forecastFinish = stretched > asOf ? stretched : dayAdd(asOf, 1);
      if (!dates.includes(forecastFinish)) dates.push(forecastFinish);
      dates.sort();
    }
  }
  let eacExact = cpi ? ac0 + remainingWork / cpi : null;
  if (given) {
    // The caller's estimate and finish (the bottom-up estimate and the plan's date) replace the CPI line.
    eacExact = asOf && val(given.atCompletionCents) !== null ? (given.atCompletionCents as number) : null;
    forecastFinish = eacExact === null || !asOf ? null : (given.finish ?? null);
    if (forecastFinish && asOf && forecastFinish <= asOf) forecastFinish = eacExact === ac0 ? asOf : dayAdd(asOf, 1);
    if (forecastFinish && !dates.includes(forecastFinish)) {
      dates.push(forecastFinish);
      dates.sort();
    }
  }
  const pv = planned.cumulative(dates);
  const ev = earned.cumulative(dates);
  const ac = actual.cumulative(dates);
  const pvEnd = pv.length ? pv[pv.length - 1] : 0;

  const points: EvPoint[] = dates.map((date, k) => {
    const past = !!asOf && date <= asOf;
    let forecast: number | null = null;
    if (forecastFinish && eacExact !== null && asOf && date >= asOf && date <= forecastFinish) {
      let share: number;
      if (date === forecastFinish) share = 1;
      else if (date === asOf) share = 0;
      else if (given) share = forecastShare(date, asOf, forecastFinish, pv[k], pvAsOf, pvEnd);
      else share = pvEnd > pvAsOf ? (pv[k] - pvAsOf) / (pvEnd - pvAsOf) : 0;
      forecast = roundHalfUpCents(ac0 + share * (eacExact - ac0));
    }
    return {
      date,
      planned: pv[k],
      earned: past ? ev[k] : null,
      actual: past ? ac[k] : null,
      remainingPlanned: bac - pv[k],
      remainingActual: past ? bac - ac[k] : null,
      forecast,
    };
  });
  return {
    rule,
    bac,
    asOf,
    unscheduledPlannedCents: unscheduled,
    points,
    current: { pv: pvAsOf, ev: ev0, ac: ac0, ...figures },
    forecastFinish,
  };
}

/** Share of the remaining forecast spent by `date`: the plan's shape where it has work left, else time. */
function forecastShare(date: string, asOf: string, finish: string, pv: number, pvAsOf: number, pvEnd: number): number {
  if (pvEnd > pvAsOf) return Math.min(1, Math.max(0, (pv - pvAsOf) / (pvEnd - pvAsOf)));
  const span = dayDiff(asOf, finish);
  return span > 0 ? Math.min(1, dayDiff(asOf, date) / span) : 1;
}
