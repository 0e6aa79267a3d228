// Return on the build and its payback date from kit sales (DESIGN §11 "Sales"). Pure; cents.
//
// Definitions followed:
// - Return on investment = (gain from the investment − cost of the investment) ÷ cost of the
//   investment, the usual textbook form (e.g. Wikipedia "Return on investment"). Here the gain is the
//   series' margin and the cost is the build's net cost from the cost roll-up (shared/costs.ts).
// - Payback period, simple (undiscounted): "the total period before the cumulative net cash inflows
//   from an investment are sufficient to have fully paid back the initial investment" (Association of
//   Corporate Treasurers, glossary "Payback period"). The build is paid for over time, so we compare
//   cumulative margin with cumulative net cost day by day (see paybackOf).
import { rollUpCosts, type CostInput } from './costs';

/** Return on the build: (margin − net cost) ÷ net cost; null when net cost is zero or less. */
export function returnOnBuild(marginCents: number, netCostCents: number): number | null {
  if (!(netCostCents > 0)) return null;
  return (marginCents - netCostCents) / netCostCents;
}

export interface DatedAmount {
  date: string;
  cents: number;
}
export interface PaybackPoint {
  date: string;
  cumulativeMarginCents: number;
  cumulativeNetCostCents: number;
}
export interface Payback {
  points: PaybackPoint[];
  /** First day cumulative margin reached cumulative net cost (above zero) and stayed there to the last day; null if not. */
  paybackDate: string | null;
  /** Net cost − margin on the last day when not paid back; 0 when paid back or nothing to pay back. */
  marginNeededCents: number;
}

/**
 * Walks both running totals day by day (every day on which either changes). The payback date is the
 * first day of the last stretch in which cumulative margin ≥ cumulative net cost > 0 — a day when
 * margin caught up but the build then cost more does not count as paid back.
 */
export function paybackOf(margin: readonly DatedAmount[], costs: readonly DatedAmount[]): Payback {
  const days = [...new Set([...margin.map((m) => m.date), ...costs.map((c) => c.date)])].sort();
  const sumBy = (xs: readonly DatedAmount[]) => {
    const m = new Map<string, number>();
    for (const x of xs) m.set(x.date, (m.get(x.date) ?? 0) + x.cents);
    return m;
  };
  const mDay = sumBy(margin);
  const cDay = sumBy(costs);
  let cm = 0;
  let cc = 0;
  let since: string | null = null;
  const points: PaybackPoint[] = [];
  for (const d of days) {
    cm += mDay.get(d) ?? 0;
    cc += cDay.get(d) ?? 0;
    points.push({ date: d, cumulativeMarginCents: cm, cumulativeNetCostCents: cc });
    if (cc > 0 && cm >= cc) since ??= d;
    else since = null;
  }
  return { points, paybackDate: since, marginNeededCents: since || cc <= 0 ? 0 : cc - cm };
}

/** The dated money of the cost roll-up; undated money (parts not yet ordered, sales with no date) falls on `asOf`. */
export interface DatedCostInput {
  labourRateCents: number;
  upgrades: CostInput['upgrades'];
  parts: (CostInput['parts'][number] & { spentOn: string | null })[];
  labour: (CostInput['labour'][number] & { workedOn: string })[];
  expenses: (CostInput['expenses'][number] & { spentOn: string })[];
  removedParts: (CostInput['removedParts'][number] & { soldOn: string | null })[];
  asOf: string;
}

/**
 * Cumulative net cost by day, each day's figure being the roll-up (rollUpCosts) of everything dated on
 * or before it, so the last day equals the build's net cost to the cent. Returned as day-by-day
 * increments for paybackOf.
 */
export function netCostByDay(input: DatedCostInput): DatedAmount[] {
  const on = (d: string | null | undefined) => d ?? input.asOf;
  const days = [
    ...new Set([
      ...input.parts.map((p) => on(p.spentOn)),
      ...input.labour.map((l) => l.workedOn),
      ...input.expenses.map((e) => e.spentOn),
      ...input.removedParts.filter((r) => r.disposition === 'sold').map((r) => on(r.soldOn)),
    ]),
  ].sort();
  const out: DatedAmount[] = [];
  let previous = 0;
  for (const d of days) {
    const net = rollUpCosts({
      labourRateCents: input.labourRateCents,
      upgrades: input.upgrades,
      parts: input.parts.filter((p) => on(p.spentOn) <= d),
      labour: input.labour.filter((l) => l.workedOn <= d),
      expenses: input.expenses.filter((e) => e.spentOn <= d),
      removedParts: input.removedParts.filter((r) => r.disposition === 'sold' && on(r.soldOn) <= d),
    }).build.netCents;
    if (net !== previous) out.push({ date: d, cents: net - previous });
    previous = net;
  }
  return out;
}
