// Health: the database and every adapter that registers a check (storage, mail).
import { Router } from 'express';
import { sequelize } from '../models';
import { config } from '../config';
import { DEMO_PASSWORD, DEMO_USERS } from '../db/seeders/0001-demo-users';

type Check = () => Promise<boolean>;
const checks = new Map<string, Check>();

/** Adapters call this at start-up so /api/health reports them. */
export function registerHealthCheck(name: string, check: Check) {
  checks.set(name, check);
}

async function safe(check: Check, ms = 2000): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  try {
    return await Promise.race([check(), new Promise<boolean>((r) => (timer = setTimeout(() => r(false), ms)))]);
  } catch {
    return false;
  } finally {
    clearTimeout(timer);
  }
}

export function healthRouter() {
  const router = Router();
  router.get('/', async (_req, res) => {
    const db = await safe(async () => (await sequelize.query('SELECT 1')) !== null);
    const extra: Record<string, boolean> = {};
    for (const [name, check] of checks) extra[name] = await safe(check);
    const ok = db && Object.values(extra).every(Boolean);
    res.status(db ? 200 : 503).json({ ok, db, ...extra });
  });
  // Liveness for a load balancer: the process answers; no I/O at all.
  router.get('/live', (_req, res) => {
    res.json({ ok: true });
  });
  // The sign-in page lists the demo accounts, in demo mode only.
  router.get('/demo', (_req, res) => {
    const demo = config().BAYSLATE_DEMO;
    res.json({ demo, accounts: demo ? DEMO_USERS.map((u) => u.email) : [], password: demo ? DEMO_PASSWORD : null });
  });
  return router;
}
