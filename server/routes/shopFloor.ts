// The shop floor: the episode being worked, for installers (and the producer and owner).
import { Router } from 'express';
import { z } from 'zod';
import { requireRole } from '../middleware/roles';
import { buildOf, loadBuild } from '../middleware/build';
import { validate, validQuery } from '../middleware/validate';
import { id } from '../../shared/schemas/common';
import { shopFloor } from '../services/shopFloor';

const query = z.strictObject({ episodeId: id.optional() });

export function shopFloorRouter() {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('installer', 'producer'), loadBuild, validate(query, 'query'), async (req, res) => {
    res.json(await shopFloor(buildOf(req), req.user!, validQuery<z.infer<typeof query>>(req).episodeId));
  });
  return router;
}
