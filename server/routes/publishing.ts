// Chapters, show notes and publishing of one episode (mounted under /api/builds/:buildId/episodes/:episodeId).
import { Router } from 'express';
import { z } from 'zod';
import { loadBuild, buildOf } from '../middleware/build';
import { requireRole } from '../middleware/roles';
import { validate } from '../middleware/validate';
import { id } from '../../shared/schemas/common';
import { publishSchema, putChaptersSchema } from '../../shared/schemas/publishing';
import * as publishing from '../services/publishing';
import { readiness } from '../services/goLive';
import { Episode } from '../models';
import { notFound } from '../errors';
import type { RequestHandler } from 'express';

const params = z.object({ buildId: id, episodeId: id });
const PUBLISHERS = ['marketing', 'producer'] as const;

/** 404 for an episode of another build before the body is looked at. */
const episodeInBuild: RequestHandler = async (req, _res, next) => {
  const found = await Episode.count({ where: { id: Number(req.params.episodeId), buildId: buildOf(req).id } });
  next(found ? undefined : notFound('Episode'));
};

export function publishingRouter() {
  const router = Router({ mergeParams: true });
  const episodeId = (req: { params: unknown }) => Number((req.params as Record<string, string>).episodeId);

  router.get('/chapters', requireRole(...PUBLISHERS), validate(params, 'params'), loadBuild, async (req, res) => {
    res.json(await publishing.getChapters(buildOf(req).id, episodeId(req)));
  });
  router.put('/chapters', requireRole(...PUBLISHERS), validate(params, 'params'), loadBuild, episodeInBuild, validate(putChaptersSchema), async (req, res) => {
    res.json(await publishing.putChapters(req.user!, buildOf(req).id, episodeId(req), req.body));
  });
  router.get('/show-notes', requireRole(...PUBLISHERS), validate(params, 'params'), loadBuild, async (req, res) => {
    res.json(await publishing.showNotes(buildOf(req), episodeId(req)));
  });
  // What stands between the episode and going live: each unfinished upgrade and what it lacks.
  router.get('/readiness', requireRole(...PUBLISHERS), validate(params, 'params'), loadBuild, episodeInBuild, async (req, res) => {
    res.json(await readiness(buildOf(req).id, episodeId(req)));
  });
  router.post('/publish', requireRole(...PUBLISHERS), validate(params, 'params'), loadBuild, episodeInBuild, validate(publishSchema), async (req, res) => {
    res.json({ episode: await publishing.publish(req.user!, buildOf(req).id, episodeId(req), req.body) });
  });
  return router;
}
