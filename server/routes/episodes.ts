// Episodes of a build: list (any role), create / change / delete (producer; installer may move the state forward).
import type { Request } from 'express';
import { ANY_ROLE } from '../middleware/roles';
import { buildOf } from '../middleware/build';
import { buildScopedRouter, recordInBuild } from './buildScoped';
import { createEpisodeSchema, updateEpisodeSchema } from '../../shared/schemas/episode';
import * as episodes from '../services/episodes';
import { Episode } from '../models';
import { send } from './send';
import { EpisodeAnswer, EpisodeList } from '../../shared/contracts/episode';

/** Another build's episode named through this build's path is 404, before the body is even read. */
const episodeInBuild = recordInBuild(Episode, 'episodeId', 'Episode');
const episodeId = (req: Request) => Number(req.params.episodeId);

export function episodesRouter() {
  return buildScopedRouter()
    .get('/', { roles: ANY_ROLE }, async (req, res) => {
      send(res, EpisodeList, { episodes: await episodes.listEpisodes(buildOf(req).id) });
    })
    .post('/', { roles: ['producer'], body: createEpisodeSchema }, async (req, res) => {
      send(res, EpisodeAnswer, { episode: await episodes.createEpisode(req.user!, buildOf(req), req.body) }, 201);
    })
    .patch(
      '/:episodeId',
      { roles: ['producer', 'installer'], record: episodeInBuild, body: updateEpisodeSchema },
      async (req, res) => {
        send(res, EpisodeAnswer, {
          episode: await episodes.updateEpisode(req.user!, buildOf(req), episodeId(req), req.body),
        });
      },
    )
    .delete('/:episodeId', { roles: ['producer'], record: episodeInBuild }, async (req, res) => {
      await episodes.deleteEpisode(req.user!, buildOf(req), episodeId(req));
      res.status(204).end();
    }).router;
}
