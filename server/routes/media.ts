// Media of one build: upload (multipart, streamed to disk then to object storage), list with
// presigned URLs, edit caption/stage, delete, and download under the original name.
import { Router, type RequestHandler, type Response } from 'express';
import type { Media } from '../models';
import { z } from 'zod';
import { loadBuild, buildOf } from '../middleware/build';
import { requireRole, ANY_ROLE } from '../middleware/roles';
import { validate, validQuery } from '../middleware/validate';
import { id } from '../../shared/schemas/common';
import { mediaListQuery, mediaPatch, type MediaListQuery } from '../../shared/schemas/media';
import { receiveOneFile, type ReceivedFile } from '../services/mediaFiles';
import * as media from '../services/media';
import { registerStorage } from '../storage';
import { badRequest } from '../errors';

const params = z.object({ buildId: id, mediaId: id });

// At import, before the server starts its local services: the fake S3 (if needed) and the health check.
registerStorage();

/** The media row named by :mediaId in this build, if this person may see it; else 404 (before any body check). */
const loadMedia: RequestHandler = async (req, res, next) => {
  res.locals.media = await media.findVisible(buildOf(req), req.user!, Number(req.params.mediaId));
  next();
};
const mediaOf = (res: Response) => res.locals.media as Media;

export function mediaRouter() {
  const router = Router({ mergeParams: true });
  router.use(loadBuild);

  router.get('/', requireRole(...ANY_ROLE), validate(mediaListQuery, 'query'), async (req, res) => {
    res.json(await media.listMedia(buildOf(req), req.user!, validQuery<MediaListQuery>(req)));
  });

  router.post(
    '/',
    requireRole('producer', 'installer'),
    (req, _res, next) => (req.is('multipart/form-data') ? next() : next(badRequest('Send the file as multipart/form-data in the field "file".', [{ path: 'file', message: 'is required' }]))),
    receiveOneFile(media.prepareStream),
    async (req, res) => {
      const record = await media.storeUpload(buildOf(req), req.user!, req.file as ReceivedFile | undefined, req.body);
      res.status(201).json({ media: record });
    },
  );

  router.patch('/:mediaId', requireRole('producer', 'installer'), validate(params, 'params'), loadMedia, validate(mediaPatch), async (req, res) => {
    res.json({ media: await media.updateMedia(buildOf(req), req.user!, mediaOf(res), req.body) });
  });

  router.delete('/:mediaId', requireRole('producer', 'installer'), validate(params, 'params'), loadMedia, async (req, res) => {
    await media.deleteMedia(buildOf(req), req.user!, mediaOf(res));
    res.status(204).end();
  });

  router.get('/:mediaId/download', requireRole(...ANY_ROLE), validate(params, 'params'), loadMedia, async (_req, res) => {
    res.set('Cache-Control', 'no-store');
    res.redirect(302, await media.downloadUrl(mediaOf(res)));
  });
  return router;
}
