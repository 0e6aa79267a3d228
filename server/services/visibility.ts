// Which money fields a person may receive. Fields a role may not see are removed from the
// response object (absent, not null), per DESIGN §2.
import { canSeeMoney, canSeeRetail } from '../../shared/domain';

export interface Viewer {
  roles: readonly string[];
}

export const seesMoney = (v: Viewer | undefined) => !!v && canSeeMoney(v.roles);
export const seesRetail = (v: Viewer | undefined) => !!v && canSeeRetail(v.roles);

/** Shop cost, labour rate, budget, value and every figure derived from them. */
export const SHOP_MONEY_FIELDS = [
  'budgetCents',
  'labourRateCents',
  'unitCostCents',
  'amountCents',
  'expectedSaleCents',
  'actualSaleCents',
  'valueAddedCents',
] as const;
export const RETAIL_FIELDS = ['retailPriceCents'] as const;

/** Returns a copy of `record` without the money fields `viewer` may not see. */
export function forViewer<T extends Record<string, unknown>>(record: T, viewer: Viewer | undefined): T {
  const out: Record<string, unknown> = { ...record };
  if (!seesMoney(viewer)) for (const f of SHOP_MONEY_FIELDS) delete out[f];
  if (!seesRetail(viewer)) for (const f of RETAIL_FIELDS) delete out[f];
  return out as T;
}

// ---- Sales (issue 15): an allow-list per role. A field reaches a role only when named here, so a
// field added to the sales answers later stays hidden until someone decides who may see it.

/** Revenue, units and attribution: the owner, marketing and producers. */
export const SALES_REVENUE_FIELDS = [
  'build',
  'id',
  'currency',
  'campaignTag',
  'attributionWindowDays',
  'asOf',
  'linesTotal',
  'series',
  'direct',
  'assisted',
  'unattributed',
  'orders',
  'units',
  'revenueCents',
  'episodes',
  'episodeId',
  'number',
  'title',
  'state',
  'releaseDate',
  'upgrades',
  'upgradeId',
  'episodeNumber',
  'sinceRelease',
  'total',
  'lines',
  'orderId',
  'lineId',
  'soldOn',
  'sku',
  'quantity',
  'campaign',
  'content',
  'attribution',
  'reason',
  'refund',
  'imports',
  'fileName',
  'linesRead',
  'linesAdded',
  'linesSkipped',
  'createdAt',
  'kind',
  'page',
  'pageSize',
] as const;
/** Cost-based figures: the owner only. */
export const SALES_OWNER_FIELDS = [
  ...SALES_REVENUE_FIELDS,
  'marginCents',
  'netCostCents',
  'returnOnBuild',
  'paybackDate',
  'marginNeededCents',
  'payback',
  'points',
  'date',
  'cumulativeMarginCents',
  'cumulativeNetCostCents',
] as const;

const SALES_ALLOW: Record<string, readonly string[]> = {
  owner: SALES_OWNER_FIELDS,
  producer: SALES_REVENUE_FIELDS,
  marketing: SALES_REVENUE_FIELDS,
};

export const seesSalesMargin = (v: Viewer | undefined) =>
  !!v && v.roles.some((r) => SALES_ALLOW[r]?.includes('marginCents'));

function keep(value: unknown, allowed: ReadonlySet<string>): unknown {
  if (Array.isArray(value)) return value.map((x) => keep(x, allowed));
  if (value === null || typeof value !== 'object' || value instanceof Date) return value;
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(value)) if (allowed.has(k)) out[k] = keep(v, allowed);
  return out;
}

/** A copy of a sales answer holding only the fields the viewer's roles are allowed (deny by default). */
export function salesForViewer<T>(answer: T, viewer: Viewer | undefined): T {
  const allowed = new Set((viewer?.roles ?? []).flatMap((r) => SALES_ALLOW[r] ?? []));
  return keep(answer, allowed) as T;
}
