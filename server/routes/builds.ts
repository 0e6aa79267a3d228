// Builds: the list everyone signed in may see, and settings the owner and producer manage.
import { Router } from 'express';
import { requireRole, requireSignedIn } from '../middleware/roles';
import { validate } from '../middleware/validate';
import { buildOf, loadBuild } from '../middleware/build';
import { createBuildSchema, updateBuildSchema } from '../../shared/schemas/build';
import { forViewer } from '../services/visibility';
import * as builds from '../services/builds';

export function buildsRouter() {
  const router = Router();

  router.get('/', requireSignedIn, async (req, res) => {
    res.json({ builds: await builds.listBuilds(req.user!) });
  });
  router.post('/', requireRole('producer'), validate(createBuildSchema), async (req, res) => {
    res.status(201).json({ build: forViewer(await builds.createBuild(req.user!, req.body), req.user) });
  });
  router.get('/:buildId', requireSignedIn, loadBuild, async (req, res) => {
    res.json({ build: forViewer(builds.toBuildRecord(buildOf(req)), req.user) });
  });
  router.patch('/:buildId', requireRole('producer'), loadBuild, validate(updateBuildSchema), async (req, res) => {
    res.json({ build: forViewer(await builds.updateBuild(req.user!, buildOf(req).id, req.body), req.user) });
  });
  router.delete('/:buildId', requireRole('owner'), loadBuild, async (req, res) => {
    await builds.deleteBuild(req.user!, buildOf(req).id);
    res.status(204).end();
  });
  return router;
}
