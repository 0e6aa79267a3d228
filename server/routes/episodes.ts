// Episodes of a build: list (any role), create / change / delete (producer; installer may move the state forward).
import { Router, type RequestHandler } from 'express';
import { requireRole, ANY_ROLE } from '../middleware/roles';
import { buildOf, loadBuild } from '../middleware/build';
import { validate } from '../middleware/validate';
import { createEpisodeSchema, episodeParams, updateEpisodeSchema } from '../../shared/schemas/episode';
import * as episodes from '../services/episodes';
import { Episode } from '../models';
import { notFound } from '../errors';

/** Another build's episode named through this build's path is 404, before the body is even read. */
const episodeInBuild: RequestHandler = async (req, _res, next) => {
  const found = await Episode.count({ where: { id: Number(req.params.episodeId), buildId: buildOf(req).id } });
  next(found ? undefined : notFound('Episode'));
};

export function episodesRouter() {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole(...ANY_ROLE), loadBuild, async (req, res) => {
    res.json({ episodes: await episodes.listEpisodes(buildOf(req).id) });
  });
  router.post('/', requireRole('producer'), loadBuild, validate(createEpisodeSchema), async (req, res) => {
    res.status(201).json({ episode: await episodes.createEpisode(req.user!, buildOf(req), req.body) });
  });
  router.patch('/:episodeId', requireRole('producer', 'installer'), loadBuild, validate(episodeParams, 'params'), episodeInBuild, validate(updateEpisodeSchema), async (req, res) => {
    res.json({ episode: await episodes.updateEpisode(req.user!, buildOf(req), Number(req.params.episodeId), req.body) });
  });
  router.delete('/:episodeId', requireRole('producer'), loadBuild, validate(episodeParams, 'params'), async (req, res) => {
    await episodes.deleteEpisode(req.user!, buildOf(req), Number(req.params.episodeId));
    res.status(204).end();
  });
  return router;
}
