// The build overview for the owner and the producer: every figure and series the screen draws, in one call.
import { Router, type Request, type Response } from 'express';
import { requireRole } from '../middleware/roles';
import { buildOf, loadBuild } from '../middleware/build';
import { cachedOverviewBody, freshOverviewBody, overviewStamp, runningOverviewBody } from '../services/overview';
import { todayIn } from '../../shared/dates';
import type { Entry } from '../services/overviewCache';
import { seesMoney } from '../services/visibility';
import { overviewAnswerWithoutMoney } from '../../shared/contracts/overview';

function send(req: Request, res: Response, entry: Entry, hit: boolean) {
  // Says whether the figures came from the cache, for anyone measuring the route.
  res.set('X-Overview-Cache', hit ? 'hit' : 'miss');
  // The cached bytes are the money roles' answer; anyone else gets only what the allow-list names.
  if (!seesMoney(req.user)) return res.json(overviewAnswerWithoutMoney.parse(JSON.parse(entry.body.toString('utf8'))));
  res.set('ETag', entry.etag);
  res.set('Cache-Control', 'private, no-cache');
  res.set('Vary', 'Accept-Encoding');
  if (req.fresh) return res.status(304).end();
  res.type('application/json');
  if (entry.gzipped && req.acceptsEncodings('gzip', 'identity') === 'gzip') {
    res.set('Content-Encoding', 'gzip');
    return res.send(entry.gzipped);
  }
  res.send(entry.body);
}

export function overviewRouter() {
  const router = Router({ mergeParams: true });
  router.get(
    '/',
    requireRole('producer'),
    // A cached overview exists only for a build that exists: deleting the build drops it.
    (req, res, next) => {
      const id = Number(req.params.buildId);
      const hit = cachedOverviewBody(id);
      if (hit) return send(req, res, hit, true);
      const before = overviewStamp(id);
      // While a change is being computed for this build, later readers wait for that answer.
      const running = runningOverviewBody(id, before);
      if (running)
        return void running.then((entry) => {
          if (entry.day === todayIn(entry.zone)) return send(req, res, entry, false);
          res.locals.overviewStamp = overviewStamp(id); // the day turned meanwhile: compute afresh
          next();
        }, next);
      res.locals.overviewStamp = before;
      next();
    },
    loadBuild,
    async (req, res) => {
      send(req, res, await freshOverviewBody(buildOf(req), res.locals.overviewStamp as string), false);
    },
  );
  return router;
}
