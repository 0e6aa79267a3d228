// Contracts of kit sales (/api/builds/:buildId/sales). Two role shapes (issue 15): the owner reads
// the cost-based figures (margin, net cost, return on the build, payback); producers and marketing
// read revenue, units and attribution only. The server strips by allow-list per role
// (salesForViewer in server/services/visibility.ts) and sends through the role's contract below, so
// a field reaches a role only when both name it.
import { z } from 'zod';
import { day, ErrorAnswer, idNumber, timestamp, type RouteTable } from './common';

const ATTRIBUTIONS = ['direct', 'assisted', 'unattributed'] as const;
const count = z.number().int();
const cents = z.number().int();

const teamFigures = z.object({ orders: count, units: count, revenueCents: cents });
const ownerFigures = teamFigures.extend({ marginCents: cents });

const teamLine = z.object({
  id: idNumber,
  orderId: z.string(),
  lineId: z.string().nullable(),
  soldOn: day,
  sku: z.string(),
  quantity: count,
  revenueCents: cents,
  campaign: z.string().nullable(),
  content: z.string().nullable(),
  attribution: z.enum(ATTRIBUTIONS),
  episodeId: idNumber.nullable(),
  reason: z.string().nullable(),
  refund: z.boolean(),
});
/** marginCents: revenue − unit cost × units; null when the SKU matches no part. */
const ownerLine = teamLine.extend({ marginCents: cents.nullable() });

const teamSeries = z.object({
  direct: teamFigures,
  assisted: teamFigures,
  unattributed: teamFigures,
  revenueCents: cents,
});
const ownerSeries = z.object({
  direct: ownerFigures,
  assisted: ownerFigures,
  unattributed: ownerFigures,
  revenueCents: cents,
  marginCents: cents,
  netCostCents: cents,
  returnOnBuild: z.number().nullable(),
  paybackDate: day.nullable(),
  marginNeededCents: cents,
});
const payback = z.object({
  points: z.array(z.object({ date: day, cumulativeMarginCents: cents, cumulativeNetCostCents: cents })),
  paybackDate: day.nullable(),
  marginNeededCents: cents,
});

function summaryOf<F extends z.ZodType, L extends z.ZodType, S extends z.ZodType>(figures: F, line: L, series: S) {
  return z.object({
    build: z.object({ id: idNumber, currency: z.string(), campaignTag: z.string(), attributionWindowDays: count }),
    asOf: day,
    linesTotal: count,
    series,
    episodes: z.array(
      z.object({
        episodeId: idNumber,
        number: count,
        title: z.string(),
        state: z.string(),
        releaseDate: day.nullable(),
        direct: figures,
        assisted: figures,
      }),
    ),
    upgrades: z.array(
      z.object({
        upgradeId: idNumber,
        title: z.string(),
        episodeId: idNumber.nullable(),
        episodeNumber: count.nullable(),
        releaseDate: day.nullable(),
        sinceRelease: figures,
      }),
    ),
    unattributed: z.object({ total: count, lines: z.array(line) }),
    imports: z.array(
      z.object({
        id: idNumber,
        fileName: z.string().nullable(),
        linesRead: count,
        linesAdded: count,
        linesSkipped: count,
        createdAt: timestamp,
      }),
    ),
  });
}
const pageOf = <L extends z.ZodType>(line: L) =>
  z.object({ kind: z.enum(ATTRIBUTIONS), total: count, page: count, pageSize: count, lines: z.array(line) });

/** GET …/sales for the owner: every figure, cost-based ones included. */
export const SalesSummaryForOwner = summaryOf(ownerFigures, ownerLine, ownerSeries).extend({ payback });
export type SalesSummaryForOwner = z.infer<typeof SalesSummaryForOwner>;
/** GET …/sales for producers and marketing: revenue, units and attribution; no margin, cost or payback. */
export const SalesSummaryForTeam = summaryOf(teamFigures, teamLine, teamSeries);
export type SalesSummaryForTeam = z.infer<typeof SalesSummaryForTeam>;

export const SalesLinesForOwner = pageOf(ownerLine);
export type SalesLinesForOwner = z.infer<typeof SalesLinesForOwner>;
export const SalesLinesForTeam = pageOf(teamLine);
export type SalesLinesForTeam = z.infer<typeof SalesLinesForTeam>;

export const SalesLineForOwner = ownerLine;
export type SalesLineForOwner = z.infer<typeof SalesLineForOwner>;
export const SalesLineForTeam = teamLine;
export type SalesLineForTeam = z.infer<typeof SalesLineForTeam>;
export type SalesFiguresForOwner = z.infer<typeof ownerFigures>;

// What a screen holds (never sent as such): the team's fields, and the owner's when sent.
const seenFigures = teamFigures.extend({ marginCents: cents.optional() });
const seenLine = teamLine.extend({ marginCents: cents.nullable().optional() });
const seenSeries = teamSeries.extend({
  direct: seenFigures,
  assisted: seenFigures,
  unattributed: seenFigures,
  ...ownerSeries
    .pick({ marginCents: true, netCostCents: true, returnOnBuild: true, paybackDate: true, marginNeededCents: true })
    .partial().shape,
});
export const SalesSummarySeen = summaryOf(seenFigures, seenLine, seenSeries).extend({ payback: payback.optional() });
export type SalesSummarySeen = z.infer<typeof SalesSummarySeen>;
export type SalesLineSeen = z.infer<typeof seenLine>;
export type SalesLinesSeen = z.infer<ReturnType<typeof pageOf<typeof seenLine>>>;
export type SalesImportRecord = SalesSummaryForOwner['imports'][number];

/** The per-role sales contracts: the owner's, or the team's for every other role. */
export interface SalesAudiences<O extends z.ZodType, T extends z.ZodType> {
  owner: O;
  team: T;
}
export const SalesSummary: SalesAudiences<typeof SalesSummaryForOwner, typeof SalesSummaryForTeam> = {
  owner: SalesSummaryForOwner,
  team: SalesSummaryForTeam,
};
export const SalesLines: SalesAudiences<typeof SalesLinesForOwner, typeof SalesLinesForTeam> = {
  owner: SalesLinesForOwner,
  team: SalesLinesForTeam,
};

/** The cost-based sales figures reach the owner only. */
export const seesSalesCost = (roles: readonly string[] | undefined) => !!roles?.includes('owner');
export function salesContractFor<O extends z.ZodType, T extends z.ZodType>(
  c: SalesAudiences<O, T>,
  roles: readonly string[] | undefined,
): O | T {
  return seesSalesCost(roles) ? c.owner : c.team;
}

/** The remembered column mapping (shared/schemas/sales.ts salesMappingSchema), or null. */
const column = z.string();
export const SalesMappingOut = z.object({
  orderId: column,
  lineId: column.nullable(),
  date: column,
  sku: column,
  quantity: column,
  revenue: column,
  currency: column.nullable(),
  landingUrl: column.nullable(),
  campaign: column.nullable(),
  content: column.nullable(),
});
export const SalesMappingAnswer = z.object({ mapping: SalesMappingOut.nullable() });
export type SalesMappingAnswer = z.infer<typeof SalesMappingAnswer>;

export const SalesProblem = z.object({ line: count, column: z.string(), message: z.string() });
export type SalesProblem = z.infer<typeof SalesProblem>;

/** POST …/sales/import (owner, marketing): the preview (200), the import (201), or a refused file (400, with `error`). */
export const SalesImportReport = z.object({
  ok: z.boolean(),
  dryRun: z.boolean(),
  fileName: z.string().nullable(),
  mapping: SalesMappingOut,
  linesRead: count,
  newLines: count,
  alreadyImported: count,
  duplicatesInFile: count,
  refunds: count,
  errors: z.array(SalesProblem),
  duplicates: z.array(z.object({ line: count, sameAs: count })),
  sample: z.array(
    z.object({
      line: count,
      orderId: z.string(),
      lineId: z.string().nullable(),
      soldOn: day,
      sku: z.string(),
      quantity: count,
      revenueCents: cents,
      currency: z.string(),
      campaign: z.string().nullable(),
      content: z.string().nullable(),
      refund: z.boolean(),
    }),
  ),
  added: count.optional(),
  importId: idNumber.optional(),
});
export type SalesImportReport = z.infer<typeof SalesImportReport>;
/** A refused file (400): the report, and beside it the error naming each problem; nothing was imported. */
/** A refused import: its report beside the error, or a plain error when the request itself was wrong (no mapping, no file). */
export const SalesImportRefused = z.union([SalesImportReport.extend({ error: ErrorAnswer.shape.error }), ErrorAnswer]);
export type SalesImportRefused = z.infer<typeof SalesImportRefused>;

/**
 * Revenue is not money in the audiences' sense (marketing reads it), and the owner's figures are not
 * the producer's: the money/retail/crew audiences cannot say this. The route table therefore holds
 * "the owner's or the team's shape" for every caller; the exact shape per role is salesContractFor
 * (what the route sends through; tests/api/salesContracts.test.ts checks every role with it).
 */
const eitherShape = <O extends z.ZodType, T extends z.ZodType>(c: SalesAudiences<O, T>) => z.union([c.owner, c.team]);

export const salesRoutes = {
  'GET /api/builds/:buildId/sales': eitherShape(SalesSummary),
  'GET /api/builds/:buildId/sales/lines': eitherShape(SalesLines),
  'GET /api/builds/:buildId/sales/mapping': SalesMappingAnswer,
  'POST /api/builds/:buildId/sales/import': SalesImportReport,
  'POST /api/builds/:buildId/sales/import 400': SalesImportRefused,
} satisfies RouteTable;
