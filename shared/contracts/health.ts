// Contracts of the health routes: /api/health/live and /ready (probes, no sign-in), /api/health
// (the diagnostic: every check by name) and /api/health/demo (demo mode only).
import { z } from 'zod';
import { timestamp, type RouteTable } from './common';

/** The process answers. */
export const Live = z.object({ ok: z.literal(true) });
export type Live = z.infer<typeof Live>;

/**
 * The summary, and beside it every check by name (storage, mail, … whatever adapters registered:
 * the loose part); 503 with the same body when not ready. failedMails: mail that used up its attempts.
 */
export const Ready = z.looseObject({
  ok: z.boolean(),
  db: z.boolean(),
  checkedAt: timestamp,
  failedMails: z.number().int().min(0).nullable(),
  stopping: z.literal(true).optional(),
});
export type Ready = z.infer<typeof Ready>;

/** The diagnostic: ok and each check by name, run now. */
export const HealthDiagnostic = z.object({ ok: z.boolean() }).catchall(z.boolean());
export type HealthDiagnostic = z.infer<typeof HealthDiagnostic>;

export const DemoAccounts = z.object({ demo: z.literal(true), accounts: z.array(z.string()), password: z.string() });
export type DemoAccounts = z.infer<typeof DemoAccounts>;

export const healthRoutes = {
  'GET /api/health/live': Live,
  'GET /api/health/ready': Ready,
  'GET /api/health': HealthDiagnostic,
  'GET /api/health/demo': DemoAccounts,
} satisfies RouteTable;
