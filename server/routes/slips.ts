// Slips and baselines of a build's episodes, and the producers' notices (producer and owner).
import { Router } from 'express';
import { requireRole } from '../middleware/roles';
import { buildOf, loadBuild } from '../middleware/build';
import * as slips from '../services/slips';

export function slipsRouter() {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('producer'), loadBuild, async (req, res) => {
    res.json(await slips.slipReport(buildOf(req)));
  });
  return router;
}

export function noticesRouter() {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('producer'), loadBuild, async (req, res) => {
    const build = buildOf(req);
    // Parts go overdue with the passing days, not with a write: look before answering.
    await slips.slipReport(build);
    res.json(await slips.listNotices(req.user!.id, build.id));
  });
  router.post('/seen', requireRole('producer'), loadBuild, async (req, res) => {
    res.json(await slips.markNoticesSeen(req.user!.id, buildOf(req).id));
  });
  return router;
}
