// Slips and baselines of a build's episodes, and the producers' notices (producer and owner).
import { buildOf } from '../middleware/build';
import { buildScopedRouter } from './buildScoped';
import * as slips from '../services/slips';
import { send } from './send';
import { NoticeList, SlipReport } from '../../shared/contracts/slips';

export function slipsRouter() {
  return buildScopedRouter().get('/', { roles: ['producer'] }, async (req, res) => {
    send(res, SlipReport, await slips.slipReport(buildOf(req)));
  }).router;
}

export function noticesRouter() {
  return buildScopedRouter()
    .get('/', { roles: ['producer'] }, async (req, res) => {
      const build = buildOf(req);
      // Parts go overdue with the passing days, not with a write: look before answering.
      await slips.slipReport(build);
      send(res, NoticeList, await slips.listNotices(req.user!.id, build.id));
    })
    .post('/seen', { roles: ['producer'] }, async (req, res) => {
      send(res, NoticeList, await slips.markNoticesSeen(req.user!.id, buildOf(req).id));
    }).router;
}
