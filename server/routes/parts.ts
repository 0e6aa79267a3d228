// Parts on the build's upgrades, and the parts CSV import.
import type { Request } from 'express';
import { z } from 'zod';
import { ANY_ROLE } from '../middleware/roles';
import { buildOf } from '../middleware/build';
import { validQuery } from '../middleware/validate';
import { buildScopedRouter, recordInBuild } from './buildScoped';
import { Part } from '../models';
import { createPartSchema, partListQuery, updatePartSchema } from '../../shared/schemas/part';
import { forViewer } from '../services/visibility';
import * as parts from '../services/parts';
import { importPartsCsv } from '../services/csv/parts';
import { csvBody, sendImportResult } from './csvHttp';

const partInBuild = recordInBuild(Part, 'partId', 'Part');
const importQuery = z.object({ dryRun: z.enum(['0', '1', 'true', 'false']).optional() });
const partId = (req: Request) => Number(req.params.partId);

export function partsRouter() {
  return buildScopedRouter()
    .get('/', { roles: ANY_ROLE, query: partListQuery }, async (req, res) => {
      res.json(await parts.listParts(buildOf(req), validQuery(req), req.user!));
    })
    .post('/', { roles: ['producer'], body: createPartSchema }, async (req, res) => {
      res.status(201).json({ part: forViewer(await parts.createPart(req.user!, buildOf(req), req.body), req.user) });
    })
    .post('/import', { roles: ['producer'], query: importQuery }, async (req, res) => {
      const dryRun = ['1', 'true'].includes(validQuery<{ dryRun?: string }>(req).dryRun ?? '');
      sendImportResult(res, await importPartsCsv(req.user!, buildOf(req), csvBody(req), dryRun));
    })
    .patch('/:partId', { roles: ['producer', 'marketing', 'installer'], record: partInBuild, body: updatePartSchema }, async (req, res) => {
      res.json({ part: forViewer(await parts.updatePart(req.user!, buildOf(req), partId(req), req.body), req.user) });
    })
    .delete('/:partId', { roles: ['producer'], record: partInBuild }, async (req, res) => {
      await parts.deletePart(req.user!, buildOf(req), partId(req));
      res.status(204).end();
    }).router;
}
