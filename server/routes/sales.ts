// Kit sales of a build (mounted at /api/builds/:buildId/sales): the figures per episode and for the
// series, one kind of attributed lines page by page, the remembered column mapping, and the import of
// the store's order export (text/csv; ?dryRun=1 previews). Import: owner and marketing; figures also
// producers; cost-based figures reach the owner only (salesForViewer, then the role's contract).
import { validQuery } from '../middleware/validate';
import { buildOf } from '../middleware/build';
import { buildScopedRouter } from './buildScoped';
import { csvBody } from './csvHttp';
import { salesForViewer } from '../services/visibility';
import { salesLines, salesSummary } from '../services/sales';
import { importSales, savedMapping } from '../services/salesImport';
import { salesImportQuery, salesLinesQuery } from '../../shared/schemas/sales';
import type { z } from 'zod';
import { send } from './send';
import {
  SalesImportReport,
  SalesLines,
  SalesMappingAnswer,
  SalesSummary,
  salesContractFor,
} from '../../shared/contracts/sales';

const FIGURES = ['marketing', 'producer'] as const;

export function salesRouter() {
  return buildScopedRouter()
    .get('/', { roles: FIGURES }, async (req, res) => {
      send(
        res,
        salesContractFor(SalesSummary, req.user?.roles),
        salesForViewer(await salesSummary(buildOf(req)), req.user),
      );
    })
    .get('/lines', { roles: FIGURES, query: salesLinesQuery }, async (req, res) => {
      send(
        res,
        salesContractFor(SalesLines, req.user?.roles),
        salesForViewer(await salesLines(buildOf(req), validQuery<z.infer<typeof salesLinesQuery>>(req)), req.user),
      );
    })
    .get('/mapping', { roles: ['marketing'] }, async (req, res) => {
      send(res, SalesMappingAnswer, { mapping: await savedMapping(buildOf(req)) });
    })
    .post('/import', { roles: ['marketing'], query: salesImportQuery }, async (req, res) => {
      const q = validQuery<z.infer<typeof salesImportQuery>>(req);
      const dryRun = ['1', 'true'].includes(q.dryRun ?? '');
      const text = csvBody(req);
      const report = await importSales(req.user!, buildOf(req), text, {
        dryRun,
        mapping: q.mapping,
        fileName: q.fileName ?? null,
      });
      if (dryRun) return send(res, SalesImportReport, report);
      if (report.ok) return send(res, SalesImportReport, report, 201);
      res.status(400).json({
        ...report,
        error: {
          code: 'bad_csv',
          message: `${report.errors.length} problem(s) in the file; nothing was imported.`,
          fields: report.errors
            .slice(0, 1000)
            .map((e) => ({ path: `line ${e.line}: ${e.column}`, message: e.message })),
        },
      });
    }).router;
}
