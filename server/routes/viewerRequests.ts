// Marketing's triage of viewer requests (mounted at /api/builds/:buildId/viewer-requests).
import { buildOf } from '../middleware/build';
import { validQuery } from '../middleware/validate';
import { triageSchema, viewerRequestQuery } from '../../shared/schemas/viewerRequest';
import { StaffRequestAnswer, StaffRequestList } from '../../shared/contracts/viewerRequest';
import * as requests from '../services/viewerRequests';
import { votesByUpgrade } from '../services/votes';
import type { RequestState } from '../../shared/domain';
import { ViewerRequest } from '../models';
import { buildScopedRouter, recordInBuild } from './buildScoped';
import { send } from './send';

/** 404 for a request of another build before the body is looked at. */
const requestInBuild = recordInBuild(ViewerRequest, 'requestId', 'Request');

export function viewerRequestsRouter() {
  return buildScopedRouter()
    .get('/', { roles: ['marketing', 'producer'], query: viewerRequestQuery }, async (req, res) => {
      const q = validQuery<{ state?: RequestState }>(req);
      const b = buildOf(req);
      send(res, StaffRequestList, {
        requests: await requests.listRequests(b.id, q.state),
        votesByUpgrade: await votesByUpgrade(b.id),
      });
    })
    .patch(
      '/:requestId',
      { roles: ['marketing', 'producer'], record: requestInBuild, body: triageSchema },
      async (req, res) => {
        send(res, StaffRequestAnswer, {
          request: await requests.triage(req.user!, buildOf(req).id, Number(req.params.requestId), req.body),
        });
      },
    ).router;
}
