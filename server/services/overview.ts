// The build overview: the database's sums (overviewQuery.ts) run through the shared roll-up and
// earned-value functions, so the screen, the report and the backlog agree to the cent.
import { AREA_LABELS, isUpgradeDone } from '../../shared/domain';
import { rollUpCosts, type CostRow } from '../../shared/costs';
import { earnedValue, earnedValueSeries, EV_CREDIT_RULES, type EvCreditRule } from '../../shared/earnedValue';
import {
  COST_RECOGNITION_DESCRIPTIONS,
  COST_RECOGNITION_LABELS,
  recogniseCosts,
  type CostRecognition,
} from '../../shared/costRecognition';
import { DEFAULT_TIME_ZONE, todayIn } from '../../shared/dates';
import {
  compactOverview,
  costRowOf,
  ratio6,
  type BuildOverview,
  type BurndownPoint,
  type OverviewCostRow,
} from '../../shared/overview';
import { Build } from '../models';
import { notFound } from '../errors';
import { loadOverviewData, loadOverviewLabour, type OverviewData } from './overviewQuery';
import { cached, keepInputs, keptInputs, runningFor, singleFlight, stamp, store } from './overviewCache';

/** The build fields the overview reads. */
export type OverviewBuild = Pick<
  Build,
  'id' | 'name' | 'slug' | 'year' | 'make' | 'model' | 'trim' | 'budgetCents' | 'labourRateCents' | 'startDate'
> &
  Partial<Pick<Build, 'timeZone' | 'costRecognition'>>;

/** The credit rule the overview states: an upgrade earns its whole budget the day it is done. */
export const OVERVIEW_CREDIT_RULE: EvCreditRule = '0/100';

/** Today in the build's zone: the status date of the figures and the day a cached copy is good for. */
const today = (zone?: string | null) => todayIn(zone ?? DEFAULT_TIME_ZONE);
const latest = (dates: (string | null | undefined)[]) => dates.reduce<string>((a, d) => (d && d > a ? d : a), '');

const ratio = ratio6;

/** A roll-up row as the screens read it: derived fields worked out as the client works them out. */
const costRow = (r: CostRow, labourCosted: boolean): OverviewCostRow =>
  costRowOf({ ...r, labourCents: labourCosted ? r.labourCents : null });

export async function buildOverview(build: OverviewBuild, now: string = today(build.timeZone)): Promise<BuildOverview> {
  return computeOverview(build, await loadOverviewData(build.id), now);
}

/** The overview's JSON bytes as cached, or null: a hit needs no database query at all. */
export function cachedOverviewBody(buildId: number) {
  return Number.isInteger(buildId) && buildId > 0 ? cached(buildId, today) : null;
}

/**
 * Computes the overview's JSON bytes and keeps them unless a change came in since `before` (from
 * `overviewStamp`). Concurrent misses for one build with the same stamp share one computation.
 * Without change notices a shared computation may start after the caller read `build`, so it reads
 * the build's row again itself (overviewCache.singleFlight).
 */
export function freshOverviewBody(build: OverviewBuild, before: string) {
  const zone = build.timeZone ?? DEFAULT_TIME_ZONE;
  const now = today(zone);
  const noticed = before.startsWith('1:');
  return singleFlight(build.id, `${before}|${now}|${zone}`, async () => {
    const b = noticed ? build : await Build.findByPk(build.id);
    if (!b) throw notFound('Build');
    const bZone = b.timeZone ?? DEFAULT_TIME_ZONE;
    const bNow = noticed ? now : today(bZone);
    return store(
      b.id,
      bNow,
      bZone,
      before,
      compactOverview(computeOverview(b, await overviewInputs(b.id, before), bNow)),
    );
  });
}

/**
 * The overview's inputs: when only labour changed since they were last read (a logged hour), the
 * labour sums are read again and everything else is reused; otherwise all is read in one query.
 */
async function overviewInputs(buildId: number, before: string): Promise<OverviewData> {
  const kept = keptInputs<OverviewData>(buildId);
  const data = kept ? { ...kept, labour: await loadOverviewLabour(buildId) } : await loadOverviewData(buildId);
  keepInputs(buildId, before, data);
  return data;
}

export const overviewStamp = stamp;
/** The answer being computed for this build since the same stamp, if any (see overviewCache.runningFor). */
export const runningOverviewBody = runningFor;

/** Pure: the overview from the loaded sums. `now` is today's date in the build's zone (YYYY-MM-DD). */
export function computeOverview(build: OverviewBuild, d: OverviewData, now: string): BuildOverview {
  const budget = build.budgetCents ?? null;
  const labourCosted = build.labourRateCents !== null && build.labourRateCents !== undefined;
  const rate = build.labourRateCents ?? 0;
  const recognitionRule: CostRecognition = build.costRecognition ?? 'fitting';

  // Status date: today in the build's zone. Money dated later is planned, not actual.
  const asOf = now;
  const doneOn = new Map<number, string | null>();
  for (const u of d.upgrades) doneOn.set(u.id, isUpgradeDone(u) ? (u.installedOn ?? asOf) : null);

  const rollup = rollUpCosts({
    labourRateCents: rate,
    upgrades: d.upgrades,
    parts: d.parts.map((p) => ({ upgradeId: p.upgradeId, quantity: 1, unitCostCents: p.cents, state: p.state })),
    labour: d.labour,
    expenses: d.expenses.map((e) => ({ upgradeId: e.upgradeId, amountCents: e.cents })),
    removedParts: d.removed.map((r) => ({
      upgradeId: r.upgradeId,
      disposition: r.disposition,
      expectedSaleCents: r.expectedCents,
      actualSaleCents: r.actualCents,
    })),
  });
  const sold = d.removed.filter((r) => r.disposition === 'sold' && r.actualCents > 0);
  const recognition = recogniseCosts({
    recognition: recognitionRule,
    asOf,
    labourRateCents: rate,
    upgrades: d.upgrades.map((u) => ({
      id: u.id,
      estimatedHours: u.estimatedHours,
      installState: u.installState,
      installedOn: u.installedOn,
      done: isUpgradeDone(u),
    })),
    parts: d.parts,
    labour: d.labour,
    expenses: d.expenses,
    recoveries: sold.map((r) => ({ upgradeId: r.upgradeId, soldOn: r.soldOn, cents: r.actualCents })),
  });

  const partsBudget = new Map<number, number>();
  for (const p of d.parts) partsBudget.set(p.upgradeId, (partsBudget.get(p.upgradeId) ?? 0) + p.cents);
  const shootDate = new Map(d.episodes.map((e) => [e.id, e.shootDate]));
  const shootOf = (u: { episodeId: number | null }) =>
    u.episodeId !== null ? (shootDate.get(u.episodeId) ?? null) : null;
  const forecastFinish = planForecastFinish(d, shootOf, asOf);
  const lastShoot = latest(d.episodes.map((e) => e.shootDate));
  const hasUpgrades = d.upgrades.length > 0;
  const headlineForecast = labourCosted && hasUpgrades ? recognition.forecast.atCompletionCents : null;
  const series = earnedValueSeries({
    bacCents: null,
    labourRateCents: rate,
    rule: OVERVIEW_CREDIT_RULE,
    asOf,
    unscheduledOn: lastShoot || forecastFinish || asOf,
    upgrades: d.upgrades.map((u) => ({
      id: u.id,
      estimatedHours: u.estimatedHours,
      partsBudgetCents: partsBudget.get(u.id) ?? 0,
      shootDate: shootOf(u),
      doneOn: doneOn.get(u.id) ?? null,
    })),
    labour: d.labour,
    expenses: d.expenses.map((e) => ({ spentOn: e.spentOn, amountCents: e.cents })),
    parts: d.parts.map((p, k) => ({ spentOn: recognition.partDates[k], costCents: p.cents })),
    recoveries: sold.map((r) => ({ soldOn: r.soldOn ?? asOf, amountCents: r.actualCents })),
    forecast: { atCompletionCents: headlineForecast, finish: forecastFinish },
  });
  const bac = hasUpgrades && labourCosted ? series.bac : null;
  const { pv, ev, ac } = series.current;
  const figures = earnedValue({ bac, pv, ev, ac, eac: headlineForecast });
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
  const zero = rollUpCosts({
    labourRateCents: 0,
    upgrades: [],
    parts: [],
    labour: [],
    expenses: [],
    removedParts: [],
  }).build;

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
  if (none)
    episodes.push({
      episodeId: null,
      number: null,
      title: 'In no episode',
      state: null,
      shootDate: null,
      upgrades: perEpisode.get(null) ?? 0,
      ...costRow(none, labourCosted),
    });

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
    timeZone: build.timeZone ?? DEFAULT_TIME_ZONE,
    labourCosted,
    headline: {
      budgetCents: budget,
      spentCents: totals.partsCents + totals.labourCents + totals.expensesCents,
      recoveredCents: totals.recoveredCents,
      expectedRecoveryCents: totals.expectedRecoveryCents,
      netCents: totals.netCents,
      remainingCents: budget === null ? null : budget - totals.netCents,
      spentShare: budget ? totals.netCents / budget : null,
      bacCents: bac,
      reserveCents: budget === null || bac === null ? null : budget - bac,
      actualCents: recognition.actualCents,
      costRecognition: recognitionRule,
      costRecognitionLabel: COST_RECOGNITION_LABELS[recognitionRule],
      costRecognitionDescription: COST_RECOGNITION_DESCRIPTIONS[recognitionRule],
      cash: recognition.cash,
      pending: recognition.pending,
      etcCents: headlineForecast === null ? null : recognition.forecast.etcCents,
      remainingHours: recognition.forecast.remainingHours,
      remainingLabourCents: labourCosted ? recognition.forecast.remainingLabourCents : null,
      remainingPartsCents: recognition.forecast.remainingPartsCents,
      plannedCents: recognition.forecast.plannedCents,
      forecastCents: headlineForecast,
      forecastVarianceCents: budget === null || headlineForecast === null ? null : budget - headlineForecast,
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
      bac,
      pv,
      ev,
      ac,
      ...figures,
      cpi: ratio(figures.cpi),
      spi: ratio(figures.spi),
      tcpi: ratio(figures.tcpi),
      tcpiEac: ratio(figures.tcpiEac),
      forecastFinish: series.forecastFinish,
      unscheduledPlannedCents: series.unscheduledPlannedCents,
    },
    upgrades: rollup.upgrades.map((r) => {
      const u = upgradeInfo.get(r.upgradeId)!;
      return { upgradeId: r.upgradeId, title: u.title, done: isUpgradeDone(u), ...costRow(r, labourCosted) };
    }),
    areas: rollup.areas.map((a) => ({
      ...costRow(a, labourCosted),
      area: a.area,
      label: AREA_LABELS[a.area] ?? a.area,
      upgrades: perArea.get(a.area) ?? 0,
    })),
    episodes,
    unassigned: costRow(rollup.unassigned, labourCosted),
    totals: costRow(totals, labourCosted),
    burndown: burndown(budget, build.startDate, series.points),
  };
}

/**
 * Remaining budget over time: budget − planned value, budget − actual cost, and budget − the forecast
 * from the status date to the forecast finish. Without a budget there is nothing to burn down: no points.
 */
function burndown(
  budget: number | null,
  startDate: string,
  points: ReturnType<typeof earnedValueSeries>['points'],
): BurndownPoint[] {
  if (budget === null || points.length === 0) return [];
  const out: BurndownPoint[] = points.map((p) => ({
    date: p.date,
    planned: budget - p.planned,
    actual: p.actual === null ? null : budget - p.actual,
    forecast: p.forecast === null ? null : budget - p.forecast,
  }));
  // The lines start from the whole budget on the build's first day.
  if (startDate < out[0].date) out.unshift({ date: startDate, planned: budget, actual: budget, forecast: null });
  return out;
}

/**
 * The plan's forecast finish: the latest shoot date of an episode holding unfinished work, or the
 * latest expected arrival of its parts when that is later. Nothing left: the status date. Work left
 * with no date at all: unknown (null).
 */
function planForecastFinish(
  d: OverviewData,
  shootOf: (u: { episodeId: number | null }) => string | null,
  asOf: string,
): string | null {
  const open = d.upgrades.filter((u) => !isUpgradeDone(u));
  if (open.length === 0) return asOf;
  const ids = new Set(open.map((u) => u.id));
  const finish = latest([
    ...open.map(shootOf),
    ...d.arrivals.filter((a) => ids.has(a.upgradeId)).map((a) => a.expectedOn),
  ]);
  return finish || null;
}
