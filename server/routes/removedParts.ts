// Stock parts taken off the vehicle: everyone reads them (money removed per role); owner and producer record them.
import type { Request } from 'express';
import { ANY_ROLE } from '../middleware/roles';
import { buildOf } from '../middleware/build';
import { validQuery } from '../middleware/validate';
import { buildScopedRouter, recordInBuild } from './buildScoped';
import { RemovedPart } from '../models';
import { createRemovedPartSchema, updateRemovedPartSchema, upgradeFilterQuery } from '../../shared/schemas/removedPart';
import { RemovedPartAnswer, RemovedPartList } from '../../shared/contracts/removedPart';
import { sendFor } from './send';
import * as service from '../services/removedParts';

const removedPartInBuild = recordInBuild(RemovedPart, 'removedPartId', 'Removed part');
const recordId = (req: Request) => Number(req.params.removedPartId);

export function removedPartsRouter() {
  return buildScopedRouter()
    .get('/', { roles: ANY_ROLE, query: upgradeFilterQuery }, async (req, res) => {
      sendFor(req, res, RemovedPartList, {
        removedParts: await service.listRemovedParts(buildOf(req), validQuery(req)),
      });
    })
    .post('/', { roles: ['producer'], body: createRemovedPartSchema }, async (req, res) => {
      sendFor(
        req,
        res,
        RemovedPartAnswer,
        { removedPart: await service.createRemovedPart(req.user!, buildOf(req), req.body) },
        201,
      );
    })
    .patch(
      '/:removedPartId',
      { roles: ['producer'], record: removedPartInBuild, body: updateRemovedPartSchema },
      async (req, res) => {
        sendFor(req, res, RemovedPartAnswer, {
          removedPart: await service.updateRemovedPart(req.user!, buildOf(req), recordId(req), req.body),
        });
      },
    )
    .delete('/:removedPartId', { roles: ['producer'], record: removedPartInBuild }, async (req, res) => {
      await service.deleteRemovedPart(req.user!, buildOf(req), recordId(req));
      res.status(204).end();
    }).router;
}
