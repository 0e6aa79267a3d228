// The shop floor: in-bay work and the episode being worked, for installers (and the producer and
// owner); stepping back a mark and recording a read safety caution.
import type { Request } from 'express';
import { z } from 'zod';
import { buildOf } from '../middleware/build';
import { validQuery } from '../middleware/validate';
import { buildScopedRouter, recordInBuild } from './buildScoped';
import { id } from '../../shared/schemas/common';
import { stepBackSchema } from '../../shared/schemas/shopFloor';
import { shopFloor } from '../services/shopFloor';
import { cautionRead, stepBack } from '../services/shopFloorMarks';
import { Upgrade } from '../models';
import { sendFor } from './send';
import { ShopFloor } from '../../shared/contracts/shopFloor';
import { UpgradeAnswer } from '../../shared/contracts/upgrade';

const query = z.strictObject({ episodeId: id.optional() });
const noBody = z.strictObject({});
const upgradeInBuild = recordInBuild(Upgrade, 'upgradeId', 'Upgrade');
const upgradeId = (req: Request) => Number(req.params.upgradeId);
const ROLES = ['installer', 'producer'] as const;

export function shopFloorRouter() {
  return buildScopedRouter()
    .get('/', { roles: ROLES, query }, async (req, res) => {
      sendFor(
        req,
        res,
        ShopFloor,
        await shopFloor(buildOf(req), req.user!, validQuery<z.infer<typeof query>>(req).episodeId),
      );
    })
    .post(
      '/upgrades/:upgradeId/step-back',
      { roles: ROLES, record: upgradeInBuild, body: stepBackSchema },
      async (req, res) => {
        sendFor(req, res, UpgradeAnswer, {
          upgrade: await stepBack(req.user!, buildOf(req), upgradeId(req), req.body),
        });
      },
    )
    .post(
      '/upgrades/:upgradeId/caution-read',
      { roles: ROLES, record: upgradeInBuild, body: noBody },
      async (req, res) => {
        await cautionRead(req.user!, buildOf(req), upgradeId(req));
        res.status(204).end();
      },
    ).router;
}
