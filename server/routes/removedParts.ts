// Stock parts taken off the vehicle: everyone reads them (money removed per role); owner and producer record them.
import { Router, type Request } from 'express';
import { z } from 'zod';
import { ANY_ROLE, requireRole } from '../middleware/roles';
import { validate, validQuery } from '../middleware/validate';
import { buildOf, loadBuild } from '../middleware/build';
import { inBuild } from './upgrades';
import { RemovedPart } from '../models';
import { upgradeFilterQuery } from '../../shared/schemas/removedPart';
import { createRemovedPartSchema, updateRemovedPartSchema } from '../../shared/schemas/removedPart';
import { forViewer } from '../services/visibility';
import * as service from '../services/removedParts';

const recordInBuild = inBuild(RemovedPart, 'removedPartId', 'Removed part');
const recordId = (req: Request) => Number(req.params.removedPartId);

export function removedPartsRouter() {
  const router = Router({ mergeParams: true });
  router.use(loadBuild);

  router.get('/', requireRole(...ANY_ROLE), validate(upgradeFilterQuery, 'query'), async (req, res) => {
    const list = await service.listRemovedParts(buildOf(req), validQuery(req), req.user!);
    res.json({ removedParts: list.map((r) => forViewer(r, req.user)) });
  });
  router.post('/', requireRole('producer'), validate(createRemovedPartSchema), async (req, res) => {
    res.status(201).json({ removedPart: forViewer(await service.createRemovedPart(req.user!, buildOf(req), req.body), req.user) });
  });
  router.patch('/:removedPartId', requireRole('producer'), recordInBuild, validate(updateRemovedPartSchema), async (req, res) => {
    res.json({ removedPart: forViewer(await service.updateRemovedPart(req.user!, buildOf(req), recordId(req), req.body), req.user) });
  });
  router.delete('/:removedPartId', requireRole('producer'), recordInBuild, async (req, res) => {
    await service.deleteRemovedPart(req.user!, buildOf(req), recordId(req));
    res.status(204).end();
  });
  return router;
}
