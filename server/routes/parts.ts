// Parts on the build's upgrades, and the parts CSV import.
import { Router, type Request } from 'express';
import { z } from 'zod';
import { ANY_ROLE, requireRole } from '../middleware/roles';
import { validate, validQuery } from '../middleware/validate';
import { buildOf, loadBuild } from '../middleware/build';
import { inBuild } from './upgrades';
import { Part } from '../models';
import { createPartSchema, partListQuery, updatePartSchema } from '../../shared/schemas/part';
import { forViewer } from '../services/visibility';
import * as parts from '../services/parts';
import { importPartsCsv } from '../services/csv/parts';
import { csvBody, sendImportResult } from '../services/csv/http';

const partInBuild = inBuild(Part, 'partId', 'Part');
const importQuery = z.object({ dryRun: z.enum(['0', '1', 'true', 'false']).optional() });
const partId = (req: Request) => Number(req.params.partId);

export function partsRouter() {
  const router = Router({ mergeParams: true });
  router.use(loadBuild);

  router.get('/', requireRole(...ANY_ROLE), validate(partListQuery, 'query'), async (req, res) => {
    res.json(await parts.listParts(buildOf(req), validQuery(req), req.user!));
  });
  router.post('/', requireRole('producer'), validate(createPartSchema), async (req, res) => {
    res.status(201).json({ part: forViewer(await parts.createPart(req.user!, buildOf(req), req.body), req.user) });
  });
  router.post('/import', requireRole('producer'), validate(importQuery, 'query'), async (req, res) => {
    const dryRun = ['1', 'true'].includes(validQuery<{ dryRun?: string }>(req).dryRun ?? '');
    sendImportResult(res, await importPartsCsv(req.user!, buildOf(req), csvBody(req), dryRun));
  });
  router.patch('/:partId', requireRole('producer', 'marketing', 'installer'), partInBuild, validate(updatePartSchema), async (req, res) => {
    res.json({ part: forViewer(await parts.updatePart(req.user!, buildOf(req), partId(req), req.body), req.user) });
  });
  router.delete('/:partId', requireRole('producer'), partInBuild, async (req, res) => {
    await parts.deletePart(req.user!, buildOf(req), partId(req));
    res.status(204).end();
  });
  return router;
}
