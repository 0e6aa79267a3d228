// Kit sales of a build (mounted at /api/builds/:buildId/sales): the figures per episode and for the
// series, one kind of attributed lines page by page, the remembered column mapping, and the import of
// the store's order export (text/csv; ?dryRun=1 previews). Import: owner and marketing; figures also
// producers; cost-based figures reach the owner only (salesForViewer).
import { Router } from 'express';
import { requireRole } from '../middleware/roles';
import { validate, validQuery } from '../middleware/validate';
import { buildOf, loadBuild } from '../middleware/build';
import { csvBody } from './csvHttp';
import { salesForViewer } from '../services/visibility';
import { salesLines, salesSummary } from '../services/sales';
import { importSales, savedMapping } from '../services/salesImport';
import { salesImportQuery, salesLinesQuery } from '../../shared/schemas/sales';
import type { z } from 'zod';

export function salesRouter() {
  const router = Router({ mergeParams: true });
  router.use(loadBuild);

  router.get('/', requireRole('marketing', 'producer'), async (req, res) => {
    res.json(salesForViewer(await salesSummary(buildOf(req)), req.user));
  });
  router.get('/lines', requireRole('marketing', 'producer'), validate(salesLinesQuery, 'query'), async (req, res) => {
    res.json(salesForViewer(await salesLines(buildOf(req), validQuery<z.infer<typeof salesLinesQuery>>(req)), req.user));
  });
  router.get('/mapping', requireRole('marketing'), async (req, res) => {
    res.json({ mapping: await savedMapping(buildOf(req)) });
  });
  router.post('/import', requireRole('marketing'), validate(salesImportQuery, 'query'), async (req, res) => {
    const q = validQuery<z.infer<typeof salesImportQuery>>(req);
    const dryRun = ['1', 'true'].includes(q.dryRun ?? '');
    const text = csvBody(req);
    const report = await importSales(req.user!, buildOf(req), text, { dryRun, mapping: q.mapping, fileName: q.fileName ?? null });
    if (dryRun) return res.json(report);
    if (report.ok) return res.status(201).json(report);
    res.status(400).json({
      ...report,
      error: {
        code: 'bad_csv',
        message: `${report.errors.length} problem(s) in the file; nothing was imported.`,
        fields: report.errors.slice(0, 1000).map((e) => ({ path: `line ${e.line}: ${e.column}`, message: e.message })),
      },
    });
  });
  return router;
}
