// The Sales screen's figures for one build: its order lines attributed to episodes (shared/sales.ts),
// the figures per episode, upgrade and series, and the payback against the build's net cost from the
// cost roll-up (shared/costs.ts). Money leaves through salesForViewer (visibility.ts).
import { QueryTypes } from 'sequelize';
import { sequelize, type Build } from '../models';
import { effectiveCampaign } from './publishing';
import { listImports } from './salesImport';
import { slugify } from '../../shared/showNotes';
import { rollUpCosts } from '../../shared/costs';
import {
  salesFigures,
  type AttributedLine,
  type SalesEpisodeInput,
  type SalesPartInput,
  type SalesUpgradeInput,
  type SaleLineInput,
  type Attribution,
} from '../../shared/sales';
import { netCostByDay, type DatedCostInput } from '../../shared/salesPayback';
import { todayIn } from '../../shared/dates';
import type { SalesSummaryForOwner } from '../../shared/contracts/sales';

const UNATTRIBUTED_SHOWN = 200;

async function q<T extends object>(sql: string, buildId: number): Promise<T[]> {
  return sequelize.query<T>(sql, { bind: [buildId], type: QueryTypes.SELECT });
}

/** The dated money of the build, for the cost roll-up by day. */
async function costInput(buildId: number, asOf: string, labourRateCents: number): Promise<DatedCostInput> {
  const [upgrades, parts, labour, expenses, removedParts] = await Promise.all([
    q<DatedCostInput['upgrades'][number]>(
      `SELECT id, area, episode_id AS "episodeId", estimated_hours AS "estimatedHours", value_added_cents AS "valueAddedCents" FROM upgrades WHERE build_id = $1`,
      buildId,
    ),
    q<DatedCostInput['parts'][number]>(
      `SELECT upgrade_id AS "upgradeId", quantity, unit_cost_cents AS "unitCostCents", state, to_char(coalesce(ordered_on, received_on), 'YYYY-MM-DD') AS "spentOn" FROM parts WHERE build_id = $1`,
      buildId,
    ),
    q<DatedCostInput['labour'][number]>(
      `SELECT upgrade_id AS "upgradeId", hours, to_char(worked_on, 'YYYY-MM-DD') AS "workedOn" FROM labour_entries WHERE build_id = $1`,
      buildId,
    ),
    q<DatedCostInput['expenses'][number]>(
      `SELECT upgrade_id AS "upgradeId", amount_cents AS "amountCents", to_char(spent_on, 'YYYY-MM-DD') AS "spentOn" FROM expenses WHERE build_id = $1`,
      buildId,
    ),
    q<DatedCostInput['removedParts'][number]>(
      `SELECT upgrade_id AS "upgradeId", disposition, expected_sale_cents AS "expectedSaleCents", actual_sale_cents AS "actualSaleCents", to_char(sold_on, 'YYYY-MM-DD') AS "soldOn" FROM removed_parts WHERE build_id = $1`,
      buildId,
    ),
  ]);
  return { labourRateCents, asOf, upgrades, parts, labour, expenses, removedParts };
}

/** Every line of the build, attributed, with the figures; `asOf` (undated money falls on it) is today in the build's zone. */
export async function computeSales(build: Build, asOf: string = todayIn(build.timeZone)) {
  const [parts, upgrades, episodes, lines, cost] = await Promise.all([
    q<SalesPartInput>(
      `SELECT id, upgrade_id AS "upgradeId", part_number AS "partNumber", store_sku AS "storeSku", unit_cost_cents AS "unitCostCents" FROM parts WHERE build_id = $1`,
      build.id,
    ),
    q<SalesUpgradeInput>(
      `SELECT id, title, episode_id AS "episodeId" FROM upgrades WHERE build_id = $1 ORDER BY id`,
      build.id,
    ),
    q<SalesEpisodeInput>(
      `SELECT id, number, title, state, to_char(release_date, 'YYYY-MM-DD') AS "releaseDate" FROM episodes WHERE build_id = $1`,
      build.id,
    ),
    q<SaleLineInput>(
      `SELECT id, order_id AS "orderId", line_id AS "lineId", to_char(sold_on, 'YYYY-MM-DD') AS "soldOn", sku, quantity, revenue_cents AS "revenueCents", campaign, content
         FROM sale_lines WHERE build_id = $1`,
      build.id,
    ),
    costInput(build.id, asOf, build.labourRateCents ?? 0),
  ]);
  const netCostCents = rollUpCosts(cost).build.netCents;
  const campaignTag = slugify(effectiveCampaign(build));
  const figures = salesFigures({
    campaignTag,
    windowDays: build.attributionWindowDays,
    parts,
    upgrades,
    episodes,
    lines,
    netCostCents,
    netCostByDay: netCostByDay(cost),
  });
  return { campaignTag, asOf, ...figures };
}

const lineOut = (l: AttributedLine) => ({
  id: l.id,
  orderId: l.orderId,
  lineId: l.lineId,
  soldOn: l.soldOn,
  sku: l.sku,
  quantity: l.quantity,
  revenueCents: l.revenueCents,
  marginCents: l.marginCents,
  campaign: l.campaign,
  content: l.content,
  attribution: l.attribution,
  episodeId: l.episodeId,
  reason: l.reason,
  refund: l.refund,
});

/** Every figure; the route strips it per role (salesForViewer, then the role's contract). */
export async function salesSummary(build: Build): Promise<SalesSummaryForOwner> {
  const s = await computeSales(build);
  const unattributed = s.lines
    .filter((l) => l.attribution === 'unattributed')
    .sort((a, b) => (a.soldOn < b.soldOn ? 1 : a.soldOn > b.soldOn ? -1 : b.id - a.id));
  return {
    build: {
      id: build.id,
      currency: build.currency,
      campaignTag: s.campaignTag,
      attributionWindowDays: build.attributionWindowDays,
    },
    asOf: s.asOf,
    linesTotal: s.lines.length,
    series: s.series,
    episodes: s.episodes,
    upgrades: s.upgrades,
    payback: s.payback,
    unattributed: { total: unattributed.length, lines: unattributed.slice(0, UNATTRIBUTED_SHOWN).map(lineOut) },
    imports: await listImports(build),
  };
}

/** One page of the build's lines of one attribution, newest first. */
export async function salesLines(build: Build, query: { kind: Attribution; page: number; pageSize: number }) {
  const s = await computeSales(build);
  const all = s.lines
    .filter((l) => l.attribution === query.kind)
    .sort((a, b) => (a.soldOn < b.soldOn ? 1 : a.soldOn > b.soldOn ? -1 : b.id - a.id));
  const start = (query.page - 1) * query.pageSize;
  return {
    kind: query.kind,
    total: all.length,
    page: query.page,
    pageSize: query.pageSize,
    lines: all.slice(start, start + query.pageSize).map(lineOut),
  };
}
