// The build overview as the screens read it: everything the overview and the build report draw.
// It travels compact (shared/contracts/overview.ts); compactOverview and expandOverview convert, and
// the derived fields (net cost, value per dollar, hours ratio, burndown dates) are worked out here,
// once, for both sides. Money in integer cents; a figure that cannot be computed is null.
import type { Area, EpisodeState } from './domain';
import type { OverviewAnswer } from './contracts/overview';
import { addDays, daysBetween } from './dates';
import type { CostRow } from './costs';
import type { EarnedValueFigures, EvCreditRule } from './earnedValue';
import type { CashView, CostRecognition } from './costRecognition';

/** A cost row as the API sends it: labour is null when the build has no labour rate. */
export type OverviewCostRow = Omit<CostRow, 'labourCents'> & {
  labourCents: number | null;
  /** Actual ÷ estimated hours; null when nothing was estimated. */
  hoursRatio: number | null;
};

export interface OverviewUpgradeRow extends OverviewCostRow {
  upgradeId: number;
  title: string;
  done: boolean;
}

export interface OverviewAreaRow extends OverviewCostRow {
  area: Area;
  label: string;
  upgrades: number;
}

export interface OverviewEpisodeRow extends OverviewCostRow {
  episodeId: number | null;
  number: number | null;
  title: string;
  state: EpisodeState | null;
  shootDate: string | null;
  upgrades: number;
}

/** Remaining budget (BAC − cumulative) on each date; null where a line is not drawn. */
export interface BurndownPoint {
  date: string;
  planned: number;
  actual: number | null;
  forecast: number | null;
}

export interface OverviewHeadline {
  budgetCents: number | null;
  /** Budget at completion: the sum of the upgrades' budgeted cost (the plan of work); null with no upgrades. */
  bacCents: number | null;
  /** Budget − BAC: money the plan of work does not use; negative when planned work exceeds the budget. */
  reserveCents: number | null;
  /** Actual cost (AC) on the status date under the build's cost recognition. */
  actualCents: number;
  costRecognition: CostRecognition;
  costRecognitionLabel: string;
  costRecognitionDescription: string;
  /** The same money by where the cash stands: paid + committed + not ordered = net. */
  cash: CashView;
  /** Net − AC, by why it is not actual cost yet. */
  pending: { receivedNotFittedCents: number; committedCents: number; notOrderedCents: number; laterDatedCents: number };
  /** Estimate to complete (bottom-up) and its parts; null without a labour rate. */
  etcCents: number | null;
  remainingHours: number;
  remainingLabourCents: number | null;
  remainingPartsCents: number;
  plannedCents: number;
  /** Parts + labour + other expenses, before recoveries. */
  spentCents: number;
  recoveredCents: number;
  expectedRecoveryCents: number;
  /** Spent − recovered: what the build has cost so far. */
  netCents: number;
  /** Budget − net; null without a budget. */
  remainingCents: number | null;
  /** Net ÷ budget; null without a budget (or a zero budget). */
  spentShare: number | null;
  /** Bottom-up estimate at completion: AC + ETC; null when it cannot be computed (no labour rate). */
  forecastCents: number | null;
  /** Budget − forecast; null when either is missing. */
  forecastVarianceCents: number | null;
  estimatedHours: number;
  actualHours: number;
  valueAddedCents: number;
  valuePerDollar: number | null;
  upgradesDone: number;
  upgradesTotal: number;
  episodesLive: number;
  episodesTotal: number;
}

export interface OverviewEarnedValue extends EarnedValueFigures {
  rule: EvCreditRule;
  ruleLabel: string;
  ruleDescription: string;
  bac: number | null;
  pv: number;
  ev: number;
  ac: number;
  forecastFinish: string | null;
  /** Planned value of upgrades in no episode with a shoot date: on no date of the plan. */
  unscheduledPlannedCents: number;
}

export interface BuildOverview {
  build: {
    id: number;
    name: string;
    slug: string;
    year: number;
    make: string;
    model: string;
    trim: string;
    budgetCents: number | null;
    labourRateCents: number | null;
    startDate: string;
  };
  /** The status date the figures are taken on: today in the build's zone. */
  asOf: string;
  timeZone: string;
  /** False when the build has no labour rate: labour cost is then not counted. */
  labourCosted: boolean;
  headline: OverviewHeadline;
  earnedValue: OverviewEarnedValue;
  upgrades: OverviewUpgradeRow[];
  areas: OverviewAreaRow[];
  episodes: OverviewEpisodeRow[];
  /** Money on no upgrade (build-wide expenses, removed parts of no upgrade). */
  unassigned: OverviewCostRow;
  totals: OverviewCostRow;
  burndown: BurndownPoint[];
}

/** Ratios are sent and shown to six significant digits: more is noise on a screen. */
export const ratio6 = (x: number | null) => (x === null ? null : Number(x.toPrecision(6)));

type WireCostRow = OverviewAnswer['totals'];

/** A cost row with its derived fields, from the fields that travel. */
export function costRowOf(r: WireCostRow): OverviewCostRow {
  const netCents = r.partsCents + (r.labourCents ?? 0) + r.expensesCents - r.recoveredCents;
  return {
    partsCents: r.partsCents,
    labourCents: r.labourCents,
    expensesCents: r.expensesCents,
    recoveredCents: r.recoveredCents,
    expectedRecoveryCents: r.expectedRecoveryCents,
    netCents,
    estimatedHours: r.estimatedHours,
    actualHours: r.actualHours,
    valueAddedCents: r.valueAddedCents,
    valuePerDollar: netCents > 0 ? ratio6(r.valueAddedCents / netCents) : null,
    hoursRatio: r.estimatedHours > 0 ? ratio6(r.actualHours / r.estimatedHours) : null,
  };
}

const wireRow = (r: OverviewCostRow): WireCostRow => ({
  partsCents: r.partsCents,
  labourCents: r.labourCents,
  expensesCents: r.expensesCents,
  recoveredCents: r.recoveredCents,
  expectedRecoveryCents: r.expectedRecoveryCents,
  estimatedHours: r.estimatedHours,
  actualHours: r.actualHours,
  valueAddedCents: r.valueAddedCents,
});

/** The overview as it travels: columns for the long lists, no derived fields. */
export function compactOverview(o: BuildOverview): OverviewAnswer {
  const u = o.upgrades;
  const from = o.burndown[0]?.date ?? null;
  return {
    build: o.build,
    asOf: o.asOf,
    timeZone: o.timeZone,
    labourCosted: o.labourCosted,
    headline: o.headline,
    earnedValue: o.earnedValue,
    upgrades: {
      upgradeId: u.map((r) => r.upgradeId),
      title: u.map((r) => r.title),
      done: u.map((r) => r.done),
      partsCents: u.map((r) => r.partsCents),
      labourCents: o.labourCosted ? u.map((r) => r.labourCents ?? 0) : null,
      expensesCents: u.map((r) => r.expensesCents),
      recoveredCents: u.map((r) => r.recoveredCents),
      expectedRecoveryCents: u.map((r) => r.expectedRecoveryCents),
      estimatedHours: u.map((r) => r.estimatedHours),
      actualHours: u.map((r) => r.actualHours),
      valueAddedCents: u.map((r) => r.valueAddedCents),
    },
    areas: o.areas.map((a) => ({ ...wireRow(a), area: a.area, label: a.label, upgrades: a.upgrades })),
    episodes: o.episodes.map((e) => ({
      ...wireRow(e),
      episodeId: e.episodeId,
      number: e.number,
      title: e.title,
      state: e.state,
      shootDate: e.shootDate,
      upgrades: e.upgrades,
    })),
    unassigned: wireRow(o.unassigned),
    totals: wireRow(o.totals),
    burndown: {
      from,
      day: o.burndown.map((p) => daysBetween(from!, p.date)),
      planned: o.burndown.map((p) => p.planned),
      actual: o.burndown.map((p) => p.actual),
      forecast: o.burndown.map((p) => p.forecast),
    },
  };
}

/** The overview as the screens read it, from the answer that travelled. */
export function expandOverview(a: OverviewAnswer): BuildOverview {
  const u = a.upgrades;
  const from = a.burndown.from ?? '';
  return {
    build: a.build,
    asOf: a.asOf,
    timeZone: a.timeZone,
    labourCosted: a.labourCosted,
    headline: a.headline,
    earnedValue: a.earnedValue,
    upgrades: u.upgradeId.map((upgradeId, k) => ({
      upgradeId,
      title: u.title[k],
      done: u.done[k],
      ...costRowOf({
        partsCents: u.partsCents[k],
        labourCents: u.labourCents === null ? null : u.labourCents[k],
        expensesCents: u.expensesCents[k],
        recoveredCents: u.recoveredCents[k],
        expectedRecoveryCents: u.expectedRecoveryCents[k],
        estimatedHours: u.estimatedHours[k],
        actualHours: u.actualHours[k],
        valueAddedCents: u.valueAddedCents[k],
      }),
    })),
    areas: a.areas.map((r) => ({ ...costRowOf(r), area: r.area, label: r.label, upgrades: r.upgrades })),
    episodes: a.episodes.map((e) => ({
      ...costRowOf(e),
      episodeId: e.episodeId,
      number: e.number,
      title: e.title,
      state: e.state,
      shootDate: e.shootDate,
      upgrades: e.upgrades,
    })),
    unassigned: costRowOf(a.unassigned),
    totals: costRowOf(a.totals),
    burndown: a.burndown.day.map((d, k) => ({
      date: addDays(from, d),
      planned: a.burndown.planned[k],
      actual: a.burndown.actual[k],
      forecast: a.burndown.forecast[k],
    })),
  };
}
