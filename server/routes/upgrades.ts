// The backlog's upgrades (build-scoped), their prerequisites and history, and the backlog/parts CSV.
import { Router, type Request } from 'express';
import { z } from 'zod';
import { ANY_ROLE, requireRole } from '../middleware/roles';
import { validate, validQuery } from '../middleware/validate';
import { buildOf, loadBuild } from '../middleware/build';
import { id } from '../../shared/schemas/common';
import { createUpgradeSchema, prerequisitesSchema, updateUpgradeSchema, upgradeListQuery, type UpgradeListQuery } from '../../shared/schemas/upgrade';
import { forViewer } from '../services/visibility';
import * as upgrades from '../services/upgrades';
import { exportUpgradesCsv, importUpgradesCsv } from '../services/csv/upgrades';
import { exportPartsCsv } from '../services/csv/parts';
import { csvBody, sendCsv, sendImportResult } from '../services/csv/http';

const params = z.object({ upgradeId: id }).passthrough();
const importQuery = z.object({ dryRun: z.enum(['0', '1', 'true', 'false']).optional() });
const upgradeId = (req: Request) => Number(req.params.upgradeId);
const dryRun = (req: Request) => ['1', 'true'].includes(validQuery<{ dryRun?: string }>(req).dryRun ?? '');

export function upgradesRouter() {
  const router = Router({ mergeParams: true });
  router.use(loadBuild);

  router.get('/', requireRole(...ANY_ROLE), validate(upgradeListQuery, 'query'), async (req, res) => {
    res.json(await upgrades.listUpgrades(buildOf(req), validQuery<UpgradeListQuery>(req), req.user!));
  });
  router.post('/', requireRole('producer'), validate(createUpgradeSchema), async (req, res) => {
    res.status(201).json({ upgrade: forViewer(await upgrades.createUpgrade(req.user!, buildOf(req), req.body), req.user) });
  });
  router.post('/import', requireRole('producer'), validate(importQuery, 'query'), async (req, res) => {
    sendImportResult(res, await importUpgradesCsv(req.user!, buildOf(req), csvBody(req), dryRun(req)));
  });
  router.get('/:upgradeId', requireRole(...ANY_ROLE), validate(params, 'params'), async (req, res) => {
    res.json(await upgrades.getUpgradeDetail(buildOf(req), upgradeId(req), req.user!));
  });
  router.patch('/:upgradeId', requireRole('producer', 'installer'), validate(params, 'params'), validate(updateUpgradeSchema), async (req, res) => {
    res.json({ upgrade: forViewer(await upgrades.updateUpgrade(req.user!, buildOf(req), upgradeId(req), req.body), req.user) });
  });
  router.delete('/:upgradeId', requireRole('producer'), validate(params, 'params'), async (req, res) => {
    await upgrades.deleteUpgrade(req.user!, buildOf(req), upgradeId(req));
    res.status(204).end();
  });
  router.put('/:upgradeId/prerequisites', requireRole('producer'), validate(params, 'params'), validate(prerequisitesSchema), async (req, res) => {
    const upgrade = await upgrades.setPrerequisites(req.user!, buildOf(req), upgradeId(req), req.body.prerequisiteIds);
    res.json({ upgrade: forViewer(upgrade, req.user) });
  });
  router.get('/:upgradeId/activity', requireRole(...ANY_ROLE), validate(params, 'params'), async (req, res) => {
    res.json({ activity: await upgrades.upgradeActivity(buildOf(req), upgradeId(req), req.user!) });
  });
  return router;
}

/** GET /upgrades.csv and /parts.csv sit beside the resources; loadBuild runs per route, not for the whole prefix. */
export function backlogCsvRouter() {
  const router = Router({ mergeParams: true });
  router.get('/upgrades.csv', requireRole('producer'), loadBuild, async (req, res) => {
    sendCsv(res, `${buildOf(req).slug}-backlog.csv`, await exportUpgradesCsv(buildOf(req)));
  });
  router.get('/parts.csv', requireRole('producer'), loadBuild, async (req, res) => {
    sendCsv(res, `${buildOf(req).slug}-parts.csv`, await exportPartsCsv(buildOf(req)));
  });
  return router;
}

