// The build overview: the database's sums (overviewQuery.ts) run through the shared roll-up and
// earned-value functions, so the screen, the report and the backlog agree to the cent.
import { AREA_LABELS, isUpgradeDone } from '../../shared/domain';
import { rollUpCosts, type CostRow } from '../../shared/costs';
import { earnedValue, earnedValueSeries, EV_CREDIT_RULES, type EvCreditRule } from '../../shared/earnedValue';
import type { BuildOverview, BurndownPoint, OverviewCostRow } from '../../shared/overview';
import type { Build } from '../models';
import { loadOverviewData, type OverviewData } from './overviewQuery';
import { cached, stamp, store } from './overviewCache';

/** The build fields the overview reads. */
export type OverviewBuild = Pick<Build, 'id' | 'name' | 'slug' | 'year' | 'make' | 'model' | 'trim' | 'budgetCents' | 'labourRateCents' | 'startDate'>;

/** The credit rule the overview states: an upgrade earns its whole budget the day it is done. */
export const OVERVIEW_CREDIT_RULE: EvCreditRule = '0/100';

const today = () => new Date().toISOString().slice(0, 10);
const latest = (dates: (string | null | undefined)[]) => dates.reduce<string>((a, d) => (d && d > a ? d : a), '');

/** Ratios are sent to six significant digits: more is noise on a screen and only adds bytes. */
const ratio = (x: number | null) => (x === null ? null : Number(x.toPrecision(6)));

function costRow(r: CostRow, labourCosted: boolean): OverviewCostRow {
  return {
    ...r,
    labourCents: labourCosted ? r.labourCents : null,
    valuePerDollar: ratio(r.valuePerDollar),
    hoursRatio: r.estimatedHours > 0 ? ratio(r.actualHours / r.estimatedHours) : null,
  };
}

export async function buildOverview(build: OverviewBuild, now: string = today()): Promise<BuildOverview> {
  return computeOverview(build, await loadOverviewData(build.id), now);
}

/** The overview's JSON bytes as cached, or null: a hit needs no database query at all. */
export function cachedOverviewBody(buildId: number) {
  return Number.isInteger(buildId) && buildId > 0 ? cached(buildId, today()) : null;
}

/** Computes the overview's JSON bytes and keeps them unless a change came in since `before` (from `overviewStamp`). */
export async function freshOverviewBody(build: OverviewBuild, before: string) {
  const now = today();
  return store(build.id, now, before, await buildOverview(build, now));
}

export const overviewStamp = stamp;

/** Pure: the overview from the loaded sums. `now` is today's date (YYYY-MM-DD). */
export function computeOverview(build: OverviewBuild, d: OverviewData, now: string): BuildOverview {
  const budget = build.budgetCents ?? null;
  const labourCosted = build.labourRateCents !== null && build.labourRateCents !== undefined;
  const rate = build.labourRateCents ?? 0;

  // Status date: today, or later when money is already recorded on a later day, so the earned-value
  // actual cost equals the roll-up's net cost. Parts not yet ordered and sales with no date count
  // as committed on the status date.
  const doneOn = new Map<number, string | null>();
  const asOf = latest([
    now,
    ...d.labour.map((l) => l.workedOn),
    ...d.parts.map((p) => p.spentOn),
    ...d.expenses.map((e) => e.spentOn),
    ...d.removed.map((r) => r.soldOn),
    ...d.upgrades.map((u) => (isUpgradeDone(u) ? u.installedOn : null)),
  ]);
  for (const u of d.upgrades) doneOn.set(u.id, isUpgradeDone(u) ? (u.installedOn ?? asOf) : null);

  const rollup = rollUpCosts({
    labourRateCents: rate,
    upgrades: d.upgrades,
    parts: d.parts.map((p) => ({ upgradeId: p.upgradeId, quantity: 1, unitCostCents: p.cents, state: 'ordered' as const })),
    labour: d.labour,
    expenses: d.expenses.map((e) => ({ upgradeId: e.upgradeId, amountCents: e.cents })),
    removedParts: d.removed.map((r) => ({
      upgradeId: r.upgradeId,
      disposition: r.disposition,
      expectedSaleCents: r.expectedCents,
      actualSaleCents: r.actualCents,
    })),
  });

  const partsBudget = new Map<number, number>();
  for (const p of d.parts) partsBudget.set(p.upgradeId, (partsBudget.get(p.upgradeId) ?? 0) + p.cents);
  const shootDate = new Map(d.episodes.map((e) => [e.id, e.shootDate]));
  const series = earnedValueSeries({
    bacCents: budget,
    labourRateCents: rate,
    rule: OVERVIEW_CREDIT_RULE,
    asOf,
    upgrades: d.upgrades.map((u) => ({
      id: u.id,
      estimatedHours: u.estimatedHours,
      partsBudgetCents: partsBudget.get(u.id) ?? 0,
      shootDate: u.episodeId !== null ? (shootDate.get(u.episodeId) ?? null) : null,
      doneOn: doneOn.get(u.id) ?? null,
    })),
    labour: d.labour,
    expenses: d.expenses.map((e) => ({ spentOn: e.spentOn, amountCents: e.cents })),
    parts: d.parts.map((p) => ({ spentOn: p.spentOn ?? asOf, costCents: p.cents })),
    recoveries: d.removed
      .filter((r) => r.disposition === 'sold' && r.actualCents > 0)
      .map((r) => ({ soldOn: r.soldOn ?? asOf, amountCents: r.actualCents })),
  });
  const { pv, ev, ac } = series.current;
  const figures = earnedValue({ bac: budget, pv, ev, ac });
  const rule = EV_CREDIT_RULES.find((r) => r.id === OVERVIEW_CREDIT_RULE)!;

  const totals = rollup.build;
  const upgradeInfo = new Map(d.upgrades.map((u) => [u.id, u]));
  const perArea = new Map<string, number>();
  const perEpisode = new Map<number | null, number>();
  for (const u of d.upgrades) {
    perArea.set(u.area, (perArea.get(u.area) ?? 0) + 1);
    perEpisode.set(u.episodeId, (perEpisode.get(u.episodeId) ?? 0) + 1);
  }
  const episodeCost = new Map(rollup.episodes.map((e) => [e.episodeId, e]));
  const zero = rollUpCosts({ labourRateCents: 0, upgrades: [], parts: [], labour: [], expenses: [], removedParts: [] }).build;

  const episodes: BuildOverview['episodes'] = d.episodes.map((e) => ({
    episodeId: e.id,
    number: e.number,
    title: e.title,
    state: e.state,
    shootDate: e.shootDate,
    upgrades: perEpisode.get(e.id) ?? 0,
    ...costRow(episodeCost.get(e.id) ?? zero, labourCosted),
  }));
  const none = episodeCost.get(null);
  if (none) episodes.push({ episodeId: null, number: null, title: 'In no episode', state: null, shootDate: null, upgrades: perEpisode.get(null) ?? 0, ...costRow(none, labourCosted) });

  return {
    build: {
      id: build.id,
      name: build.name,
      slug: build.slug,
      year: build.year,
      make: build.make,
      model: build.model,
      trim: build.trim,
      budgetCents: budget,
      labourRateCents: build.labourRateCents ?? null,
      startDate: build.startDate,
    },
    asOf,
    labourCosted,
    headline: {
      budgetCents: budget,
      spentCents: totals.partsCents + totals.labourCents + totals.expensesCents,
      recoveredCents: totals.recoveredCents,
      expectedRecoveryCents: totals.expectedRecoveryCents,
      netCents: totals.netCents,
      remainingCents: budget === null ? null : budget - totals.netCents,
      spentShare: budget ? totals.netCents / budget : null,
      forecastCents: figures.eac === null ? null : Math.round(figures.eac),
      forecastVarianceCents: figures.vac === null ? null : Math.round(figures.vac),
      estimatedHours: totals.estimatedHours,
      actualHours: totals.actualHours,
      valueAddedCents: totals.valueAddedCents,
      valuePerDollar: totals.valuePerDollar,
      upgradesDone: d.upgrades.filter((u) => isUpgradeDone(u)).length,
      upgradesTotal: d.upgrades.length,
      episodesLive: d.episodes.filter((e) => e.state === 'live').length,
      episodesTotal: d.episodes.length,
    },
    earnedValue: {
      rule: rule.id,
      ruleLabel: rule.label,
      ruleDescription: rule.description,
      bac: budget,
      pv,
      ev,
      ac,
      ...figures,
      forecastFinish: budget === null ? null : series.forecastFinish,
      unscheduledPlannedCents: series.unscheduledPlannedCents,
    },
    upgrades: rollup.upgrades.map((r) => {
      const u = upgradeInfo.get(r.upgradeId)!;
      return {
        upgradeId: r.upgradeId,
        title: u.title,
        area: u.area,
        episodeId: u.episodeId,
        installState: u.installState,
        done: isUpgradeDone(u),
        ...costRow(r, labourCosted),
      };
    }),
    areas: rollup.areas.map((a) => ({ ...costRow(a, labourCosted), area: a.area, label: AREA_LABELS[a.area] ?? a.area, upgrades: perArea.get(a.area) ?? 0 })),
    episodes,
    unassigned: costRow(rollup.unassigned, labourCosted),
    totals: costRow(totals, labourCosted),
    burndown: burndown(budget, build.startDate, series.points),
  };
}

/** Remaining budget over time. Without a budget there is nothing to burn down: no points. */
function burndown(budget: number | null, startDate: string, points: ReturnType<typeof earnedValueSeries>['points']): BurndownPoint[] {
  if (budget === null || points.length === 0) return [];
  const out: BurndownPoint[] = points.map((p) => ({
    date: p.date,
    planned: p.remainingPlanned,
    actual: p.remainingActual,
    forecast: p.forecast === null ? null : budget - p.forecast,
  }));
  // The line starts from the whole budget on the build's first day.
  if (startDate < out[0].date) out.unshift({ date: startDate, planned: budget, actual: budget, forecast: null });
  return out;
}
