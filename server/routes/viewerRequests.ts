// Marketing's triage of viewer requests (mounted at /api/builds/:buildId/viewer-requests).
import { Router } from 'express';
import { z } from 'zod';
import { loadBuild, buildOf } from '../middleware/build';
import { requireRole } from '../middleware/roles';
import { validate, validQuery } from '../middleware/validate';
import { id } from '../../shared/schemas/common';
import { triageSchema, viewerRequestQuery } from '../../shared/schemas/viewerRequest';
import * as requests from '../services/viewerRequests';
import { votesByUpgrade } from '../services/votes';
import type { RequestState } from '../../shared/domain';
import { ViewerRequest } from '../models';
import { notFound } from '../errors';
import type { RequestHandler } from 'express';

/** 404 for a request of another build before the body is looked at. */
const requestInBuild: RequestHandler = async (req, _res, next) => {
  const found = await ViewerRequest.count({ where: { id: Number(req.params.requestId), buildId: buildOf(req).id } });
  next(found ? undefined : notFound('Request'));
};

export function viewerRequestsRouter() {
  const router = Router({ mergeParams: true });
  router.get('/', requireRole('marketing', 'producer'), validate(z.object({ buildId: id }), 'params'), loadBuild, validate(viewerRequestQuery, 'query'), async (req, res) => {
    const q = validQuery<{ state?: RequestState }>(req);
    const b = buildOf(req);
    res.json({ requests: await requests.listRequests(b.id, q.state), votesByUpgrade: await votesByUpgrade(b.id) });
  });
  router.patch('/:requestId', requireRole('marketing', 'producer'), validate(z.object({ buildId: id, requestId: id }), 'params'), loadBuild, requestInBuild, validate(triageSchema), async (req, res) => {
    res.json({ request: await requests.triage(req.user!, buildOf(req).id, Number(req.params.requestId), req.body) });
  });
  return router;
}
