// Writes the append-only activity record, inside the caller's transaction.
import type { Transaction } from 'sequelize';
import { Activity } from '../models';
import { fieldWords, valueWords } from '../../shared/schemas/errorMap';

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

/** One change as a person reads it: "Unit cost: — → $489.00", "Install segment: Not shot → Shot". */
export interface ReadableChange {
  field: string;
  from: string;
  to: string;
}

/** Record keys nobody needs to read: ids, versions, positions and timestamps. */
const INTERNAL =
  /^(id|version|createdAt|updatedAt|episodePosition|position|emailHash|confirmTokenHash|emailSealed)$|Ids?$/;
const money = new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD' });

function readableValue(key: string, v: unknown): string {
  if (v === null || v === undefined || v === '') return '—';
  if (/Cents$/.test(key) && typeof v === 'number') return money.format(v / 100);
  if (typeof v === 'boolean') return v ? 'Yes' : 'No';
  if (Array.isArray(v)) return v.length ? v.map((x) => readableValue(key, x)).join(', ') : '—';
  if (
    typeof v === 'string' &&
    /^[a-z]+(_[a-z]+)*$/.test(v) &&
    /(state|segment|Segment|State|area|kind|stage|condition|disposition|category|action)$/i.test(key)
  )
    return valueWords(v);
  if (typeof v === 'object') return JSON.stringify(v);
  return String(v);
}

/**
 * The changes of one history entry in words: field labels, states in words, money formatted for
 * those who may see it and left out for the rest, internal fields (ids, versions) left out.
 */
export function readableChanges(
  changes: Record<string, [unknown, unknown]> | null | undefined,
  may: { money: boolean; retail: boolean },
): ReadableChange[] {
  const out: ReadableChange[] = [];
  for (const [key, pair] of Object.entries(changes ?? {})) {
    if (INTERNAL.test(key)) continue;
    if (/Cents$/.test(key) && !(key === 'retailPriceCents' ? may.retail : may.money)) continue;
    const [a, b] = Array.isArray(pair) ? pair : [null, pair];
    out.push({ field: fieldWords(key), from: readableValue(key, a), to: readableValue(key, b) });
  }
  return out;
}
