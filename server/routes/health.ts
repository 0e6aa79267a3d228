// Health: /live (the process answers; no I/O), /ready (the database and every adapter that
// registers a check, each with a short time-out, the result reused for about a second), and
// /api/health (every check, run afresh: a diagnostic). /demo lists the demo sign-ins, in demo mode only.
import { Router } from 'express';
import { sequelize } from '../models';
import { config } from '../config';
import { DEMO_EMAILS } from '../db/demoAccounts';
import { countFailedMails } from '../mail/outbox';
import { healthChecks, type HealthCheck as Check } from '../health';
import { send } from './send';
import { DemoAccounts, HealthDiagnostic, Live, Ready } from '../../shared/contracts/health';

async function safe(check: Check, ms: number): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  try {
    return await Promise.race([check(), new Promise<boolean>((r) => (timer = setTimeout(() => r(false), ms)))]);
  } catch {
    return false;
  } finally {
    clearTimeout(timer);
  }
}

let draining = false;
/** Set on SIGTERM: readiness answers 503 so a load balancer stops sending new requests here. */
export function markDraining() {
  draining = true;
}

/** failedMails: mail that used up its attempts (the owner resends it); counted, not a reason to stop traffic. */
type Readiness = {
  ok: boolean;
  db: boolean;
  checkedAt: string;
  checks: Record<string, boolean>;
  failedMails: number | null;
};
const REUSE_MS = 1000;
let last: { at: number; result: Promise<Readiness> } | null = null;

async function runChecks(): Promise<Readiness> {
  const ms = config().READY_CHECK_TIMEOUT_MS;
  const checks = healthChecks();
  const names = ['db', ...checks.keys()];
  const [results, failedMails] = await Promise.all([
    Promise.all([
      safe(async () => (await sequelize.query('SELECT 1')) !== null, ms),
      ...[...checks.values()].map((c) => safe(c, ms)),
    ]),
    countFailedMails().catch(() => null),
  ]);
  const each: Record<string, boolean> = {};
  names.forEach((n, i) => (each[n] = results[i]));
  return { ok: results.every(Boolean), db: results[0], checkedAt: new Date().toISOString(), checks: each, failedMails };
}

/** The checks' result, computed at most once a second however many callers ask. */
export function readiness(): Promise<Readiness> {
  if (!last || Date.now() - last.at > REUSE_MS) last = { at: Date.now(), result: runChecks() };
  return last.result;
}

/** /live and /ready: mounted ahead of sessions (app.ts), so they answer with no cookie lookup. */
export function healthProbesRouter() {
  const router = Router();
  router.get('/live', (_req, res) => {
    send(res, Live, { ok: true });
  });
  router.get('/ready', async (_req, res) => {
    const { checks: each, ...r } = await readiness();
    const ok = r.ok && !draining;
    send(res, Ready, { ...each, ...r, ok, ...(draining ? { stopping: true as const } : {}) }, ok ? 200 : 503);
  });
  return router;
}

export function healthRouter() {
  const router = Router();
  // The diagnostic answer: every check run now (point load balancers at /live and /ready instead).
  router.get('/', async (_req, res) => {
    const { checks: each, ok, db } = await runChecks();
    send(res, HealthDiagnostic, { ok, ...each }, db ? 200 : 503);
  });
  // The sign-in page lists the demo accounts, in demo mode only; otherwise there is no such route.
  router.get('/demo', (_req, res, next) => {
    if (!config().BAYSLATE_DEMO) return next();
    send(res, DemoAccounts, { demo: true, accounts: [...DEMO_EMAILS], password: 'bayslate-demo' });
  });
  return router;
}
