// The build overview: every figure and series of the overview screen and the build report, in one call.
import { api } from './http';
import { expandOverview, type BuildOverview } from '@shared/overview';
import type { OverviewAnswer } from '@shared/contracts/overview';

export type {
  BuildOverview,
  OverviewUpgradeRow,
  OverviewAreaRow,
  OverviewEpisodeRow,
  OverviewCostRow,
  BurndownPoint,
} from '@shared/overview';

export const overviewApi = {
  /** The answer travels compact (columns, no derived fields); the screens read it expanded. */
  get: async (buildId: number | string): Promise<BuildOverview> =>
    expandOverview(await api.get<OverviewAnswer>(`/api/builds/${buildId}/overview`)),
};

/** Cents as a plain decimal for CSV files (no currency sign, no grouping): 123456 → "1234.56". */
export function centsForCsv(cents: number | null | undefined): string {
  if (cents === null || cents === undefined || !Number.isFinite(cents)) return '';
  const sign = cents < 0 ? '-' : '';
  const a = Math.abs(Math.round(cents));
  return `${sign}${Math.floor(a / 100)}.${String(a % 100).padStart(2, '0')}`;
}

/** A ratio for people: 2 decimals, or a dash. */
export function formatRatio(x: number | null | undefined, digits = 2): string {
  return x === null || x === undefined || !Number.isFinite(x) ? '—' : x.toFixed(digits);
}

export function formatShare(x: number | null | undefined): string {
  return x === null || x === undefined || !Number.isFinite(x) ? '—' : `${Math.round(x * 1000) / 10} %`;
}
