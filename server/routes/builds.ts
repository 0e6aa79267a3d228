// Builds: the list everyone signed in may see, and settings the owner and producer manage. The
// routes of one build run the build-scoped order (routes/buildScoped.ts): role, build, validation.
import { Router } from 'express';
import { requireRole, requireSignedIn } from '../middleware/roles';
import { validate } from '../middleware/validate';
import { buildOf } from '../middleware/build';
import { createBuildSchema, updateBuildSchema } from '../../shared/schemas/build';
import { BuildAnswer, BuildList } from '../../shared/contracts/build';
import { scopedChain } from './buildScoped';
import { sendFor } from './send';
import * as builds from '../services/builds';

export function buildsRouter() {
  const router = Router();

  router.get('/', requireSignedIn, async (req, res) => {
    sendFor(req, res, BuildList, { builds: await builds.listBuilds(req.user!) });
  });
  router.post('/', requireRole('producer'), validate(createBuildSchema), async (req, res) => {
    sendFor(req, res, BuildAnswer, { build: await builds.createBuild(req.user!, req.body) }, 201);
  });
  router.get('/:buildId', ...scopedChain({ roles: 'signed-in' }), async (req, res) => {
    sendFor(req, res, BuildAnswer, { build: builds.toBuildRecord(buildOf(req)) });
  });
  router.patch('/:buildId', ...scopedChain({ roles: ['producer'], body: updateBuildSchema }), async (req, res) => {
    sendFor(req, res, BuildAnswer, { build: await builds.updateBuild(req.user!, buildOf(req).id, req.body) });
  });
  router.delete('/:buildId', ...scopedChain({ roles: ['owner'] }), async (req, res) => {
    await builds.deleteBuild(req.user!, buildOf(req).id);
    res.status(204).end();
  });
  return router;
}
