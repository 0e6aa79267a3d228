// Importing a store's order export into a build: check every line (salesCsv.ts), preview what would be
// added, and write all new lines in one transaction or none. Lines already imported are skipped by the
// database's own unique indexes (INSERT … ON CONFLICT DO NOTHING), so a file imported twice adds nothing.
import { QueryTypes } from 'sequelize';
import { sequelize, Build, SaleImport, SalesMapping } from '../models';
import { badRequest } from '../errors';
import { record, type Actor } from './activity';
import { readSalesCsv, type ParsedSaleLine } from './salesCsv';
import { salesMappingSchema, type SalesMapping as Mapping } from '../../shared/schemas/sales';
import { ZodError } from 'zod';
import type { SalesImportReport } from '../../shared/contracts/sales';

/** The report is the contract's (shared/contracts/sales.ts): preview, import, or a refused file. */
export type { SalesImportReport };

const SAMPLE = 20;

export async function savedMapping(build: Build): Promise<Mapping | null> {
  return (await SalesMapping.findByPk(build.id))?.mapping ?? null;
}

/** The mapping given with the request, or the one remembered for the build; 400 when neither. */
export async function mappingFor(build: Build, given: unknown): Promise<Mapping> {
  if (given === undefined) {
    const saved = await savedMapping(build);
    if (!saved)
      throw badRequest('Check these fields: mapping.', [
        {
          path: 'mapping',
          message: 'is required: pick which column holds what (no mapping is remembered for this build yet)',
        },
      ]);
    return saved;
  }
  const parsed = salesMappingSchema.safeParse(given);
  // The error middleware words each issue; the paths say they are inside the mapping.
  if (!parsed.success) throw new ZodError(parsed.error.issues.map((i) => ({ ...i, path: ['mapping', ...i.path] })));
  return parsed.data;
}

/** Indexes (0-based, into `lines`) of lines the build already has. */
async function alreadyThere(buildId: number, lines: ParsedSaleLine[]): Promise<Set<number>> {
  if (!lines.length) return new Set();
  const rows = await sequelize.query<{ i: number }>(
    `SELECT (x.i - 1)::int AS i
       FROM unnest($2::text[], $3::text[], $4::text[], $5::int[], $6::int[]) WITH ORDINALITY AS x(o, l, s, q, r, i)
      WHERE EXISTS (
        SELECT 1 FROM sale_lines sl
         WHERE sl.build_id = $1 AND sl.order_id = x.o
           AND ((x.l IS NOT NULL AND sl.line_id = x.l)
             OR (x.l IS NULL AND sl.line_id IS NULL AND sl.sku = x.s AND sl.quantity = x.q AND sl.revenue_cents = x.r)))`,
    {
      bind: [
        buildId,
        lines.map((l) => l.orderId),
        lines.map((l) => l.lineId),
        lines.map((l) => l.sku),
        lines.map((l) => l.quantity),
        lines.map((l) => l.revenueCents),
      ],
      type: QueryTypes.SELECT,
    },
  );
  return new Set(rows.map((r) => r.i));
}

export async function importSales(
  actor: Actor,
  build: Build,
  text: string,
  opts: { dryRun: boolean; mapping: unknown; fileName?: string | null },
): Promise<SalesImportReport> {
  const mapping = await mappingFor(build, opts.mapping);
  const { lines, linesRead, errors } = readSalesCsv(text, mapping, build.currency);
  const unique = lines.filter((l) => l.duplicateOf === null);
  const report: SalesImportReport = {
    ok: errors.length === 0,
    dryRun: opts.dryRun,
    fileName: opts.fileName ?? null,
    mapping,
    linesRead,
    newLines: 0,
    alreadyImported: 0,
    duplicatesInFile: lines.length - unique.length,
    refunds: unique.filter((l) => l.refund).length,
    errors,
    duplicates: lines.filter((l) => l.duplicateOf !== null).map((l) => ({ line: l.line, sameAs: l.duplicateOf! })),
    sample: lines.slice(0, SAMPLE).map(({ duplicateOf: _d, ...l }) => l),
  };
  if (errors.length) return report;

  if (opts.dryRun) {
    const there = await alreadyThere(build.id, unique);
    report.alreadyImported = there.size;
    report.newLines = unique.length - there.size;
    return report;
  }

  return sequelize.transaction(async (t) => {
    const imp = await SaleImport.create(
      {
        buildId: build.id,
        userId: actor.id,
        fileName: opts.fileName ?? null,
        linesRead,
        linesAdded: 0,
        linesSkipped: 0,
      },
      { transaction: t },
    );
    const col = <K extends keyof ParsedSaleLine>(k: K) => unique.map((l) => l[k]);
    const [{ n: added }] = await sequelize.query<{ n: number }>(
      `WITH ins AS (
         INSERT INTO sale_lines (build_id, import_id, order_id, line_id, sold_on, sku, quantity, revenue_cents, currency, campaign, content)
         SELECT $1, $2, o, l, d, s, q, r, c, ca, co
           FROM unnest($3::text[], $4::text[], $5::date[], $6::text[], $7::int[], $8::int[], $9::text[], $10::text[], $11::text[]) AS x(o, l, d, s, q, r, c, ca, co)
         ON CONFLICT DO NOTHING
         RETURNING 1)
       SELECT count(*)::int AS n FROM ins`,
      {
        bind: [
          build.id,
          imp.id,
          col('orderId'),
          col('lineId'),
          col('soldOn'),
          col('sku'),
          col('quantity'),
          col('revenueCents'),
          col('currency'),
          col('campaign'),
          col('content'),
        ],
        transaction: t,
        type: QueryTypes.SELECT,
      },
    );
    imp.linesAdded = added;
    imp.linesSkipped = linesRead - added;
    await imp.save({ transaction: t });
    await SalesMapping.upsert({ buildId: build.id, mapping }, { transaction: t });
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'sale_import',
      entityId: imp.id,
      action: 'import',
      summary: `Imported sales${opts.fileName ? ` from ${opts.fileName}` : ''}: ${added} new line(s), ${linesRead - added} already there or repeated`,
    });
    return { ...report, newLines: added, alreadyImported: unique.length - added, added, importId: imp.id };
  });
}

/** Imports of a build, newest first. */
export async function listImports(build: Build) {
  const rows = await SaleImport.findAll({
    where: { buildId: build.id },
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC'],
    ],
    limit: 50,
  });
  return rows.map((r) => ({
    id: r.id,
    fileName: r.fileName,
    linesRead: r.linesRead,
    linesAdded: r.linesAdded,
    linesSkipped: r.linesSkipped,
    createdAt: r.createdAt.toISOString(),
  }));
}
