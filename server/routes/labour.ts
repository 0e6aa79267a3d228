// Labour entries: everyone reads them; installers log their own hours, owner and producer anyone's.
import { Router, type Request } from 'express';
import { z } from 'zod';
import { ANY_ROLE, requireRole } from '../middleware/roles';
import { validate, validQuery } from '../middleware/validate';
import { buildOf, loadBuild } from '../middleware/build';
import { inBuild } from './upgrades';
import { LabourEntry } from '../models';
import { upgradeFilterQuery } from '../../shared/schemas/removedPart';
import { createLabourSchema, updateLabourSchema } from '../../shared/schemas/labour';
import { forViewer } from '../services/visibility';
import * as service from '../services/labour';

const recordInBuild = inBuild(LabourEntry, 'labourId', 'Labour entry');
const recordId = (req: Request) => Number(req.params.labourId);

export function labourRouter() {
  const router = Router({ mergeParams: true });
  router.use(loadBuild);

  router.get('/', requireRole(...ANY_ROLE), validate(upgradeFilterQuery, 'query'), async (req, res) => {
    const list = await service.listLabour(buildOf(req), validQuery(req));
    res.json({ labour: list.map((r) => forViewer(r, req.user)) });
  });
  router.post('/', requireRole('producer', 'installer'), validate(createLabourSchema), async (req, res) => {
    res.status(201).json({ labourEntry: forViewer(await service.createLabour(req.user!, buildOf(req), req.body), req.user) });
  });
  router.patch('/:labourId', requireRole('producer', 'installer'), recordInBuild, validate(updateLabourSchema), async (req, res) => {
    res.json({ labourEntry: forViewer(await service.updateLabour(req.user!, buildOf(req), recordId(req), req.body), req.user) });
  });
  router.delete('/:labourId', requireRole('producer', 'installer'), recordInBuild, async (req, res) => {
    await service.deleteLabour(req.user!, buildOf(req), recordId(req));
    res.status(204).end();
  });
  return router;
}
