// The shop floor: in-bay work and the episode being worked, for installers (and the producer and
// owner); stepping back a mark and recording a read safety caution.
import { Router, type Request } from 'express';
import { z } from 'zod';
import { requireRole } from '../middleware/roles';
import { buildOf, loadBuild } from '../middleware/build';
import { validate, validQuery } from '../middleware/validate';
import { id } from '../../shared/schemas/common';
import { stepBackSchema } from '../../shared/schemas/shopFloor';
import { shopFloor } from '../services/shopFloor';
import { cautionRead, stepBack } from '../services/shopFloorMarks';
import { forViewer } from '../services/visibility';
import { Upgrade } from '../models';
import { recordInBuild as inBuild } from './buildScoped';

const query = z.strictObject({ episodeId: id.optional() });
const noBody = z.strictObject({});
const upgradeInBuild = inBuild(Upgrade, 'upgradeId', 'Upgrade');
const upgradeId = (req: Request) => Number(req.params.upgradeId);

export function shopFloorRouter() {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('installer', 'producer'), loadBuild, validate(query, 'query'), async (req, res) => {
    res.json(await shopFloor(buildOf(req), req.user!, validQuery<z.infer<typeof query>>(req).episodeId));
  });
  router.post('/upgrades/:upgradeId/step-back', requireRole('installer', 'producer'), loadBuild, upgradeInBuild, validate(stepBackSchema), async (req, res) => {
    res.json({ upgrade: forViewer(await stepBack(req.user!, buildOf(req), upgradeId(req), req.body), req.user) });
  });
  router.post('/upgrades/:upgradeId/caution-read', requireRole('installer', 'producer'), loadBuild, upgradeInBuild, validate(noBody), async (req, res) => {
    await cautionRead(req.user!, buildOf(req), upgradeId(req));
    res.status(204).end();
  });
  return router;
}
