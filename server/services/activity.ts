// Writes the append-only activity record, inside the caller's transaction.
import type { Transaction } from 'sequelize';
import { Activity } from '../models';

export interface Actor {
  id: number;
  name: string;
}

const IGNORED = new Set(['updatedAt', 'createdAt', 'version']);

/** Field-by-field differences between two plain records: { field: [before, after] }. */
export function diff(before: Record<string, unknown> | null, after: Record<string, unknown> | null) {
  const out: Record<string, [unknown, unknown]> = {};
  const keys = new Set([...Object.keys(before ?? {}), ...Object.keys(after ?? {})]);
  for (const k of keys) {
    if (IGNORED.has(k)) continue;
    const a = before?.[k] ?? null;
    const b = after?.[k] ?? null;
    if (JSON.stringify(a) !== JSON.stringify(b)) out[k] = [a, b];
  }
  return out;
}

export async function record(
  t: Transaction | null,
  entry: {
    actor: Actor | null;
    buildId: number | null;
    entity: string;
    entityId: number | null;
    action: string;
    summary: string;
    before?: Record<string, unknown> | null;
    after?: Record<string, unknown> | null;
    changes?: Record<string, [unknown, unknown]>;
  },
) {
  await Activity.create(
    {
      buildId: entry.buildId,
      userId: entry.actor?.id ?? null,
      userName: entry.actor?.name ?? null,
      entity: entry.entity,
      entityId: entry.entityId,
      action: entry.action,
      summary: entry.summary,
      changes: entry.changes ?? diff(entry.before ?? null, entry.after ?? null),
    },
    { transaction: t ?? undefined },
  );
}
