// Live updates of one build as server-sent events: "change" messages naming what changed, for
// every signed-in role (the browser re-fetches through its role-filtered API), a comment every
// 25 s so proxies keep the stream open.
import { z } from 'zod';
import { ANY_ROLE } from '../middleware/roles';
import { buildOf } from '../middleware/build';
import { buildScopedRouter } from './buildScoped';
import { subscribe } from '../services/buildEvents';
import { allow } from '../../shared/contracts/common';
import { BuildChange } from '../../shared/contracts/events';

const HEARTBEAT_MS = 25_000;
const query = z.strictObject({});

export function eventsRouter() {
  return buildScopedRouter().get('/', { roles: ANY_ROLE, query }, async (req, res) => {
    res.writeHead(200, {
      'Content-Type': 'text/event-stream; charset=utf-8',
      'Cache-Control': 'no-cache, no-transform',
      Connection: 'keep-alive',
      'X-Accel-Buffering': 'no',
    });
    let n = 0;
    const send = (what: string[]) =>
      res.write(`id: ${++n}\nevent: change\ndata: ${JSON.stringify(allow(BuildChange, { what }))}\n\n`);
    const stop = await subscribe(buildOf(req).id, send);
    res.write(`retry: 2000\nevent: ready\ndata: {}\n\n`);
    const beat = setInterval(() => res.write(': still here\n\n'), HEARTBEAT_MS);
    req.on('close', () => {
      clearInterval(beat);
      stop();
    });
  }).router;
}
