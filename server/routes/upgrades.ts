// The backlog's upgrades (build-scoped), their prerequisites and history, and the backlog/parts CSV.
import type { Request } from 'express';
import { z } from 'zod';
import { ANY_ROLE } from '../middleware/roles';
import { validQuery } from '../middleware/validate';
import { buildOf } from '../middleware/build';
import { buildScopedRouter, recordInBuild } from './buildScoped';
import {
  createUpgradeSchema,
  prerequisitesSchema,
  updateUpgradeSchema,
  upgradeListQuery,
  type UpgradeListQuery,
} from '../../shared/schemas/upgrade';
import { ActivityAnswer, UpgradeAnswer, UpgradeDetail, UpgradePage } from '../../shared/contracts/upgrade';
import { send, sendFor } from './send';
import * as upgrades from '../services/upgrades';
import { Upgrade } from '../models';
import { exportUpgradesCsv, importUpgradesCsv } from '../services/csv/upgrades';
import { exportPartsCsv } from '../services/csv/parts';
import { csvBody, sendCsv, sendImportResult } from './csvHttp';

const importQuery = z.object({ dryRun: z.enum(['0', '1', 'true', 'false']).optional() });
const upgradeId = (req: Request) => Number(req.params.upgradeId);
const dryRun = (req: Request) => ['1', 'true'].includes(validQuery<{ dryRun?: string }>(req).dryRun ?? '');

const upgradeInBuild = recordInBuild(Upgrade, 'upgradeId', 'Upgrade');

export function upgradesRouter() {
  return buildScopedRouter()
    .get('/', { roles: ANY_ROLE, query: upgradeListQuery }, async (req, res) => {
      sendFor(req, res, UpgradePage, await upgrades.listUpgrades(buildOf(req), validQuery<UpgradeListQuery>(req)));
    })
    .post('/', { roles: ['producer'], body: createUpgradeSchema }, async (req, res) => {
      sendFor(
        req,
        res,
        UpgradeAnswer,
        { upgrade: await upgrades.createUpgrade(req.user!, buildOf(req), req.body) },
        201,
      );
    })
    .post('/import', { roles: ['producer'], query: importQuery }, async (req, res) => {
      sendImportResult(res, await importUpgradesCsv(req.user!, buildOf(req), csvBody(req), dryRun(req)));
    })
    .get('/:upgradeId', { roles: ANY_ROLE, record: upgradeInBuild }, async (req, res) => {
      sendFor(req, res, UpgradeDetail, await upgrades.getUpgradeDetail(buildOf(req), upgradeId(req), req.user!));
    })
    .patch(
      '/:upgradeId',
      { roles: ['producer', 'installer'], record: upgradeInBuild, body: updateUpgradeSchema },
      async (req, res) => {
        sendFor(req, res, UpgradeAnswer, {
          upgrade: await upgrades.updateUpgrade(req.user!, buildOf(req), upgradeId(req), req.body),
        });
      },
    )
    .delete('/:upgradeId', { roles: ['producer'], record: upgradeInBuild }, async (req, res) => {
      await upgrades.deleteUpgrade(req.user!, buildOf(req), upgradeId(req));
      res.status(204).end();
    })
    .put(
      '/:upgradeId/prerequisites',
      { roles: ['producer'], record: upgradeInBuild, body: prerequisitesSchema },
      async (req, res) => {
        const upgrade = await upgrades.setPrerequisites(
          req.user!,
          buildOf(req),
          upgradeId(req),
          req.body.prerequisiteIds,
        );
        sendFor(req, res, UpgradeAnswer, { upgrade });
      },
    )
    .get('/:upgradeId/activity', { roles: ANY_ROLE, record: upgradeInBuild }, async (req, res) => {
      send(res, ActivityAnswer, { activity: await upgrades.upgradeActivity(buildOf(req), upgradeId(req), req.user!) });
    }).router;
}

/** GET /upgrades.csv and /parts.csv sit beside the resources; loadBuild runs per route, not for the whole prefix. */
export function backlogCsvRouter() {
  return buildScopedRouter()
    .get('/upgrades.csv', { roles: ['producer'] }, async (req, res) => {
      sendCsv(res, `${buildOf(req).slug}-backlog.csv`, await exportUpgradesCsv(buildOf(req)));
    })
    .get('/parts.csv', { roles: ['producer'] }, async (req, res) => {
      sendCsv(res, `${buildOf(req).slug}-parts.csv`, await exportPartsCsv(buildOf(req)));
    }).router;
}
