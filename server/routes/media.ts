// Media of one build: upload (multipart, streamed to disk then to object storage), list with
// presigned URLs, edit caption/stage, delete, and download under the original name.
import type { RequestHandler, Response } from 'express';
import type { Media } from '../models';
import { buildOf } from '../middleware/build';
import { ANY_ROLE } from '../middleware/roles';
import { validQuery } from '../middleware/validate';
import { receiveOneFile } from '../middleware/upload';
import { mediaListQuery, mediaPatch, type MediaListQuery } from '../../shared/schemas/media';
import { MediaAnswer, MediaPage } from '../../shared/contracts/media';
import type { ReceivedFile } from '../services/mediaFiles';
import * as media from '../services/media';
import { registerStorage } from '../storage';
import { badRequest, notFound } from '../errors';
import { buildScopedRouter } from './buildScoped';
import { send } from './send';

// At import, before the server starts its local services: the fake S3 (if needed) and the health check.
registerStorage();

/** The record step: the media row named by :mediaId in this build, if this person may see it; else 404. */
const mediaInBuild: RequestHandler = async (req, res, next) => {
  const id = Number(req.params.mediaId);
  if (!Number.isInteger(id) || id <= 0 || id > 2_147_483_647) return next(notFound('Media'));
  res.locals.media = await media.findVisible(buildOf(req), req.user!, id);
  next();
};
const mediaOf = (res: Response) => res.locals.media as Media;

const multipartOnly: RequestHandler = (req, _res, next) =>
  req.is('multipart/form-data')
    ? next()
    : next(
        badRequest('Send the file as multipart/form-data in the field "file".', [
          { path: 'file', message: 'is required' },
        ]),
      );
/** The file streams into storage once its type is known and the fields sent before it check out. */
const receiveFile = receiveOneFile((req, detected) => media.prepareStream(buildOf(req), req.user!, req.body, detected));

export function mediaRouter() {
  return buildScopedRouter()
    .get('/', { roles: ANY_ROLE, query: mediaListQuery }, async (req, res) => {
      send(res, MediaPage, await media.listMedia(buildOf(req), req.user!, validQuery<MediaListQuery>(req)));
    })
    .post('/', { roles: ['producer', 'installer'] }, multipartOnly, receiveFile, async (req, res) => {
      const record = await media.storeUpload(buildOf(req), req.user!, req.file as ReceivedFile | undefined, req.body);
      send(res, MediaAnswer, { media: record }, 201);
    })
    .patch(
      '/:mediaId',
      { roles: ['producer', 'installer'], record: mediaInBuild, body: mediaPatch },
      async (req, res) => {
        send(res, MediaAnswer, { media: await media.updateMedia(buildOf(req), req.user!, mediaOf(res), req.body) });
      },
    )
    .delete('/:mediaId', { roles: ['producer', 'installer'], record: mediaInBuild }, async (req, res) => {
      await media.deleteMedia(buildOf(req), req.user!, mediaOf(res));
      res.status(204).end();
    })
    .get('/:mediaId/download', { roles: ANY_ROLE, record: mediaInBuild }, async (_req, res) => {
      res.set('Cache-Control', 'no-store');
      res.redirect(302, await media.downloadUrl(mediaOf(res)));
    }).router;
}
