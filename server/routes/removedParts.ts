// Stock parts taken off the vehicle: everyone reads them (money removed per role); owner and producer record them.
import type { Request } from 'express';
import { ANY_ROLE } from '../middleware/roles';
import { buildOf } from '../middleware/build';
import { validQuery } from '../middleware/validate';
import { buildScopedRouter, recordInBuild } from './buildScoped';
import { RemovedPart } from '../models';
import { createRemovedPartSchema, updateRemovedPartSchema, upgradeFilterQuery } from '../../shared/schemas/removedPart';
import { forViewer } from '../services/visibility';
import * as service from '../services/removedParts';

const removedPartInBuild = recordInBuild(RemovedPart, 'removedPartId', 'Removed part');
const recordId = (req: Request) => Number(req.params.removedPartId);

export function removedPartsRouter() {
  return buildScopedRouter()
    .get('/', { roles: ANY_ROLE, query: upgradeFilterQuery }, async (req, res) => {
      const list = await service.listRemovedParts(buildOf(req), validQuery(req), req.user!);
      res.json({ removedParts: list.map((r) => forViewer(r, req.user)) });
    })
    .post('/', { roles: ['producer'], body: createRemovedPartSchema }, async (req, res) => {
      res.status(201).json({ removedPart: forViewer(await service.createRemovedPart(req.user!, buildOf(req), req.body), req.user) });
    })
    .patch('/:removedPartId', { roles: ['producer'], record: removedPartInBuild, body: updateRemovedPartSchema }, async (req, res) => {
      res.json({ removedPart: forViewer(await service.updateRemovedPart(req.user!, buildOf(req), recordId(req), req.body), req.user) });
    })
    .delete('/:removedPartId', { roles: ['producer'], record: removedPartInBuild }, async (req, res) => {
      await service.deleteRemovedPart(req.user!, buildOf(req), recordId(req));
      res.status(204).end();
    }).router;
}
