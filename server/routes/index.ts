// Every API router and where it is mounted. The authorization matrix test reads routeTable()
// so that a route added here without a matrix row fails the build.
import { Router, type Express } from 'express';
import { authRouter } from './auth';
import { usersRouter } from './users';
import { healthRouter } from './health';

interface Mount {
  prefix: string;
  router: Router;
}

function mounts(): Mount[] {
  return [
    { prefix: '/api/health', router: healthRouter() },
    { prefix: '/api/auth', router: authRouter() },
    { prefix: '/api/users', router: usersRouter() },
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

type Layer = { route?: { path: string | string[]; methods: Record<string, boolean> }; handle?: { stack?: Layer[] }; matchers?: unknown };

function routesOf(router: Router, prefix: string): { method: string; path: string }[] {
  const out: { method: string; path: string }[] = [];
  for (const layer of (router as unknown as { stack: Layer[] }).stack) {
    if (!layer.route) continue;
    const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
    for (const p of paths) {
      for (const [method, on] of Object.entries(layer.route.methods)) {
        if (on && method !== '_all') out.push({ method: method.toUpperCase(), path: (prefix + (p === '/' ? '' : p)) || '/' });
      }
    }
  }
  return out;
}

/** Every API route as "METHOD /path/:param", for the authorization matrix test. */
export function routeTable() {
  return table;
}
