// Every API router and where it is mounted. The authorization matrix test reads routeTable()
// so that a route added here without a matrix row fails the build.
import { Router, type Express } from 'express';
import { authRouter } from './auth';
import { usersRouter } from './users';
import { healthRouter } from './health';
import { mediaRouter } from './media';
import { overviewRouter } from './overview';
import { buildsRouter } from './builds';
import { upgradesRouter, backlogCsvRouter } from './upgrades';
import { partsRouter } from './parts';
import { removedPartsRouter } from './removedParts';
import { labourRouter } from './labour';
import { expensesRouter } from './expenses';
import { episodesRouter } from './episodes';
import { planRouter } from './plan';
import { shopFloorRouter } from './shopFloor';
import { buildCalendarRouter, calendarFeedRouter } from './calendar';
import { publishingRouter } from './publishing';
import { linkHealthRouter, campaignRouter } from './linkHealth';
import { viewerRequestsRouter } from './viewerRequests';
import { publicRouter } from './public';
import { invitationsRouter } from './invitations';
import { mailRouter } from './mail';
import { slipsRouter, noticesRouter } from './slips';
import { eventsRouter } from './events';
import { salesRouter } from './sales';

interface Mount {
  prefix: string;
  router: Router;
}

function mounts(): Mount[] {
  return [
    { prefix: '/api/health', router: healthRouter() },
    { prefix: '/api/auth', router: authRouter() },
    { prefix: '/api/users', router: usersRouter() },
    { prefix: '/api/builds/:buildId/media', router: mediaRouter() },
    { prefix: '/api/builds/:buildId/overview', router: overviewRouter() },
    { prefix: '/api/builds', router: buildsRouter() },
    { prefix: '/api/builds/:buildId/upgrades', router: upgradesRouter() },
    { prefix: '/api/builds/:buildId', router: backlogCsvRouter() },
    { prefix: '/api/builds/:buildId/parts', router: partsRouter() },
    { prefix: '/api/builds/:buildId/removed-parts', router: removedPartsRouter() },
    { prefix: '/api/builds/:buildId/labour', router: labourRouter() },
    { prefix: '/api/builds/:buildId/expenses', router: expensesRouter() },
    // Before the episodes router, so its own middleware never stands in front of these paths.
    { prefix: '/api/builds/:buildId/episodes/:episodeId', router: publishingRouter() },
    { prefix: '/api/builds/:buildId/episodes', router: episodesRouter() },
    { prefix: '/api/builds/:buildId/plan', router: planRouter() },
    { prefix: '/api/builds/:buildId/shop-floor', router: shopFloorRouter() },
    { prefix: '/api/builds/:buildId/events', router: eventsRouter() },
    { prefix: '/api/builds/:buildId/calendar', router: buildCalendarRouter() },
    { prefix: '/api/calendar', router: calendarFeedRouter() },
    { prefix: '/api/builds/:buildId/link-health', router: linkHealthRouter() },
    { prefix: '/api/builds/:buildId/campaign', router: campaignRouter() },
    { prefix: '/api/builds/:buildId/viewer-requests', router: viewerRequestsRouter() },
    { prefix: '/api/public', router: publicRouter() },
    { prefix: '/api/invitations', router: invitationsRouter() },
    { prefix: '/api/mail', router: mailRouter() },
    { prefix: '/api/builds/:buildId/slips', router: slipsRouter() },
    { prefix: '/api/builds/:buildId/notices', router: noticesRouter() },
    { prefix: '/api/builds/:buildId/sales', router: salesRouter() },
  ];
}

let table: { method: string; path: string }[] = [];

export function mountRoutes(app: Express) {
  const list = mounts();
  table = [];
  for (const m of list) {
    app.use(m.prefix, m.router);
    table.push(...routesOf(m.router, m.prefix));
  }
}

type Layer = {
  route?: { path: string | string[]; methods: Record<string, boolean> };
  handle?: { stack?: Layer[] };
  matchers?: unknown;
};

function routesOf(router: Router, prefix: string): { method: string; path: string }[] {
  const out: { method: string; path: string }[] = [];
  for (const layer of (router as unknown as { stack: Layer[] }).stack) {
    if (!layer.route) continue;
    const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
    for (const p of paths) {
      for (const [method, on] of Object.entries(layer.route.methods)) {
        if (on && method !== '_all')
          out.push({ method: method.toUpperCase(), path: prefix + (p === '/' ? '' : p) || '/' });
      }
    }
  }
  return out;
}

/** Every API route as "METHOD /path/:param", for the authorization matrix test. */
export function routeTable() {
  return table;
}
