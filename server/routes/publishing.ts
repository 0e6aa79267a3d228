// Chapters, show notes and publishing of one episode (mounted under /api/builds/:buildId/episodes/:episodeId).
import type { Request } from 'express';
import { buildOf } from '../middleware/build';
import { buildScopedRouter, recordInBuild } from './buildScoped';
import { publishSchema, putChaptersSchema } from '../../shared/schemas/publishing';
import * as publishing from '../services/publishing';
import { readiness } from '../services/goLive';
import { Episode } from '../models';
import { send } from './send';
import { EpisodeAnswer } from '../../shared/contracts/episode';
import { ChaptersAnswer, ChaptersSaved, Readiness, ShowNotesAnswer } from '../../shared/contracts/publishing';

const PUBLISHERS = ['marketing', 'producer'] as const;
/** 404 for an episode of another build before the body is looked at. */
const episodeInBuild = recordInBuild(Episode, 'episodeId', 'Episode');
const scoped = { roles: PUBLISHERS, record: episodeInBuild };
const episodeId = (req: Request) => Number(req.params.episodeId);

export function publishingRouter() {
  return (
    buildScopedRouter()
      .get('/chapters', scoped, async (req, res) => {
        send(res, ChaptersAnswer, await publishing.getChapters(buildOf(req).id, episodeId(req)));
      })
      .put('/chapters', { ...scoped, body: putChaptersSchema }, async (req, res) => {
        send(res, ChaptersSaved, await publishing.putChapters(req.user!, buildOf(req).id, episodeId(req), req.body));
      })
      .get('/show-notes', scoped, async (req, res) => {
        send(res, ShowNotesAnswer, await publishing.showNotes(buildOf(req), episodeId(req)));
      })
      // What stands between the episode and going live: each unfinished upgrade and what it lacks.
      .get('/readiness', scoped, async (req, res) => {
        send(res, Readiness, await readiness(buildOf(req).id, episodeId(req)));
      })
      .post('/publish', { ...scoped, body: publishSchema }, async (req, res) => {
        send(res, EpisodeAnswer, {
          episode: await publishing.publish(req.user!, buildOf(req).id, episodeId(req), req.body),
        });
      }).router
  );
}
