// The shape of GET /api/builds/:buildId/overview: everything the build overview and the build
// report draw, in one response. Money in integer cents; a figure that cannot be computed is null.
import type { Area, EpisodeState, InstallState } from './domain';
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
  area: Area;
  episodeId: number | null;
  installState: InstallState;
  done: boolean;
  /** Budgeted cost: estimated hours × labour rate + its parts. */
  budgetedCents: number;
  /** Estimate to complete: remaining hours × rate + parts not in actual cost + money dated later. */
  etcCents: number;
  remainingHours: number;
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
  build: { id: number; name: string; slug: string; year: number; make: string; model: string; trim: string; budgetCents: number | null; labourRateCents: number | null; startDate: string };
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
