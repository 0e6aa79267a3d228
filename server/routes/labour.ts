// Labour entries: everyone reads them; installers log their own hours, owner and producer anyone's.
import type { Request } from 'express';
import { ANY_ROLE } from '../middleware/roles';
import { buildOf } from '../middleware/build';
import { validQuery } from '../middleware/validate';
import { buildScopedRouter, recordInBuild } from './buildScoped';
import { LabourEntry } from '../models';
import { upgradeFilterQuery } from '../../shared/schemas/removedPart';
import { createLabourSchema, updateLabourSchema } from '../../shared/schemas/labour';
import { LabourAnswer, LabourList } from '../../shared/contracts/labour';
import { send } from './send';
import * as service from '../services/labour';

const labourInBuild = recordInBuild(LabourEntry, 'labourId', 'Labour entry');
const recordId = (req: Request) => Number(req.params.labourId);

export function labourRouter() {
  return buildScopedRouter()
    .get('/', { roles: ANY_ROLE, query: upgradeFilterQuery }, async (req, res) => {
      const list = await service.listLabour(buildOf(req), validQuery(req));
      send(res, LabourList, { labour: list });
    })
    .post('/', { roles: ['producer', 'installer'], body: createLabourSchema }, async (req, res) => {
      send(res, LabourAnswer, { labourEntry: await service.createLabour(req.user!, buildOf(req), req.body) }, 201);
    })
    .patch(
      '/:labourId',
      { roles: ['producer', 'installer'], record: labourInBuild, body: updateLabourSchema },
      async (req, res) => {
        send(res, LabourAnswer, {
          labourEntry: await service.updateLabour(req.user!, buildOf(req), recordId(req), req.body),
        });
      },
    )
    .delete('/:labourId', { roles: ['producer', 'installer'], record: labourInBuild }, async (req, res) => {
      await service.deleteLabour(req.user!, buildOf(req), recordId(req));
      res.status(204).end();
    }).router;
}
