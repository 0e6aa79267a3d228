// The backlog's upgrades (build-scoped), their prerequisites and history, and the backlog/parts CSV.
import { Router, type Request, type RequestHandler } from 'express';
import { z } from 'zod';
import { ANY_ROLE, requireRole } from '../middleware/roles';
import { validate, validQuery } from '../middleware/validate';
import { buildOf, loadBuild } from '../middleware/build';
import { createUpgradeSchema, prerequisitesSchema, updateUpgradeSchema, upgradeListQuery, type UpgradeListQuery } from '../../shared/schemas/upgrade';
import { forViewer } from '../services/visibility';
import { notFound } from '../errors';
import * as upgrades from '../services/upgrades';
import { Upgrade } from '../models';
import { exportUpgradesCsv, importUpgradesCsv } from '../services/csv/upgrades';
import { exportPartsCsv } from '../services/csv/parts';
import { csvBody, sendCsv, sendImportResult } from '../services/csv/http';

const importQuery = z.object({ dryRun: z.enum(['0', '1', 'true', 'false']).optional() });
const upgradeId = (req: Request) => Number(req.params.upgradeId);
const dryRun = (req: Request) => ['1', 'true'].includes(validQuery<{ dryRun?: string }>(req).dryRun ?? '');

/**
 * 404 before the body is validated when :param names no record of this build, so a record of
 * another build is never told apart from one that does not exist (runs after requireRole).
 */
export function inBuild(model: { count: (o: { where: Record<string, number> }) => Promise<number> }, param: string, label: string): RequestHandler {
  return async (req, _res, next) => {
    const id = Number(req.params[param]);
    if (!Number.isInteger(id) || id <= 0 || id > 2_147_483_647) return next(notFound(label));
    const n = await model.count({ where: { id, buildId: buildOf(req).id } });
    next(n ? undefined : notFound(label));
  };
}
const upgradeInBuild = inBuild(Upgrade, 'upgradeId', 'Upgrade');

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
  router.get('/:upgradeId', requireRole(...ANY_ROLE), upgradeInBuild, async (req, res) => {
    res.json(await upgrades.getUpgradeDetail(buildOf(req), upgradeId(req), req.user!));
  });
  router.patch('/:upgradeId', requireRole('producer', 'installer'), upgradeInBuild, validate(updateUpgradeSchema), async (req, res) => {
    res.json({ upgrade: forViewer(await upgrades.updateUpgrade(req.user!, buildOf(req), upgradeId(req), req.body), req.user) });
  });
  router.delete('/:upgradeId', requireRole('producer'), upgradeInBuild, async (req, res) => {
    await upgrades.deleteUpgrade(req.user!, buildOf(req), upgradeId(req));
    res.status(204).end();
  });
  router.put('/:upgradeId/prerequisites', requireRole('producer'), upgradeInBuild, validate(prerequisitesSchema), async (req, res) => {
    const upgrade = await upgrades.setPrerequisites(req.user!, buildOf(req), upgradeId(req), req.body.prerequisiteIds);
    res.json({ upgrade: forViewer(upgrade, req.user) });
  });
  router.get('/:upgradeId/activity', requireRole(...ANY_ROLE), upgradeInBuild, async (req, res) => {
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

