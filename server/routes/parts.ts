// Parts on the build's upgrades, and the parts CSV import.
import type { Request } from 'express';
import { z } from 'zod';
import { ANY_ROLE } from '../middleware/roles';
import { buildOf } from '../middleware/build';
import { validQuery } from '../middleware/validate';
import { buildScopedRouter, recordInBuild } from './buildScoped';
import { Part } from '../models';
import { createPartSchema, partListQuery, updatePartSchema } from '../../shared/schemas/part';
import { PartAnswer, PartPage } from '../../shared/contracts/part';
import { sendFor } from './send';
import * as parts from '../services/parts';
import { importPartsCsv } from '../services/csv/parts';
import { csvBody, sendImportResult } from './csvHttp';

const partInBuild = recordInBuild(Part, 'partId', 'Part');
const importQuery = z.object({ dryRun: z.enum(['0', '1', 'true', 'false']).optional() });
const partId = (req: Request) => Number(req.params.partId);

export function partsRouter() {
  return buildScopedRouter()
    .get('/', { roles: ANY_ROLE, query: partListQuery }, async (req, res) => {
      sendFor(req, res, PartPage, await parts.listParts(buildOf(req), validQuery(req)));
    })
    .post('/', { roles: ['producer'], body: createPartSchema }, async (req, res) => {
      sendFor(req, res, PartAnswer, { part: await parts.createPart(req.user!, buildOf(req), req.body) }, 201);
    })
    .post('/import', { roles: ['producer'], query: importQuery }, async (req, res) => {
      const dryRun = ['1', 'true'].includes(validQuery<{ dryRun?: string }>(req).dryRun ?? '');
      sendImportResult(res, await importPartsCsv(req.user!, buildOf(req), csvBody(req), dryRun));
    })
    .patch(
      '/:partId',
      { roles: ['producer', 'marketing', 'installer'], record: partInBuild, body: updatePartSchema },
      async (req, res) => {
        sendFor(req, res, PartAnswer, { part: await parts.updatePart(req.user!, buildOf(req), partId(req), req.body) });
      },
    )
    .delete('/:partId', { roles: ['producer'], record: partInBuild }, async (req, res) => {
      await parts.deletePart(req.user!, buildOf(req), partId(req));
      res.status(204).end();
    }).router;
}
