// Idempotent changes (the shop floor's waiting changes, issue 14): the first request with a key
// claims it; its answer is kept; a repeat with the same key gets that answer again instead of
// making the change twice. A receipt lives a week.
import { QueryTypes } from 'sequelize';
import { sequelize } from '../models';

export const RECEIPT_DAYS = 7;

export type Claim =
  | { state: 'new' }
  | { state: 'replay'; status: number; body: unknown }
  | { state: 'busy' }
  | { state: 'mismatch'; method: string; path: string };

interface Row {
  method: string;
  path: string;
  status: number | null;
  body: unknown;
}

/** Claims `key` for this person's request, or says what the earlier request with it became. */
export async function claimReceipt(
  userId: number,
  key: string,
  method: string,
  path: string,
  attempt = 1,
): Promise<Claim> {
  // A receipt older than a week is as good as gone (the sweep may not have reached it yet): the
  // key is claimed afresh in the same statement, so two requests can never both take it.
  const inserted = await sequelize.query<{ key: string }>(
    `INSERT INTO request_receipts (user_id, key, method, path) VALUES (:userId, :key, :method, :path)
     ON CONFLICT (user_id, key) DO UPDATE
       SET method = EXCLUDED.method, path = EXCLUDED.path, status = NULL, body = NULL, created_at = now()
       WHERE request_receipts.created_at < now() - make_interval(days => :days)
     RETURNING key`,
    { replacements: { userId, key, method, path, days: RECEIPT_DAYS }, type: QueryTypes.SELECT },
  );
  if (inserted.length) return { state: 'new' };
  const [row] = await sequelize.query<Row>(
    'SELECT method, path, status, body FROM request_receipts WHERE user_id = :userId AND key = :key',
    {
      replacements: { userId, key },
      type: QueryTypes.SELECT,
    },
  );
  // Released meanwhile (the first request failed): claim again, a few times at most.
  if (!row) return attempt < 3 ? claimReceipt(userId, key, method, path, attempt + 1) : { state: 'busy' };
  if (row.method !== method || row.path !== path) return { state: 'mismatch', method: row.method, path: row.path };
  if (row.status === null) return { state: 'busy' };
  return { state: 'replay', status: row.status, body: row.body };
}

/** Keeps the answer the claimed request got. */
export async function keepReceipt(userId: number, key: string, status: number, body: unknown) {
  await sequelize.query(
    'UPDATE request_receipts SET status = :status, body = CAST(:body AS JSONB) WHERE user_id = :userId AND key = :key',
    {
      replacements: { userId, key, status, body: JSON.stringify(body ?? null) },
    },
  );
}

/** Lets the key be used again (the request failed on the server's side, so a retry may succeed). */
export async function releaseReceipt(userId: number, key: string) {
  await sequelize.query('DELETE FROM request_receipts WHERE user_id = :userId AND key = :key AND status IS NULL', {
    replacements: { userId, key },
  });
}

/** Forgets receipts older than a week; answers how many went. */
export async function sweepReceipts(): Promise<number> {
  const [, meta] = await sequelize.query(
    'DELETE FROM request_receipts WHERE created_at < now() - make_interval(days => :days)',
    { replacements: { days: RECEIPT_DAYS } },
  );
  return (meta as { rowCount?: number } | undefined)?.rowCount ?? 0;
}

let sweepTimer: NodeJS.Timeout | null = null;

/** Sweeps old receipts on a schedule (hourly), outside any request. */
export function startReceiptSweeper(intervalMs = 60 * 60 * 1000) {
  if (sweepTimer) return;
  const tick = () => {
    sweepReceipts()
      .catch((err) => console.error(`[bayslate] receipt sweep failed: ${err?.message ?? err}`))
      .finally(() => {
        if (sweepTimer) sweepTimer = setTimeout(tick, intervalMs).unref();
      });
  };
  sweepTimer = setTimeout(tick, intervalMs).unref();
}

export function stopReceiptSweeper() {
  if (sweepTimer) clearTimeout(sweepTimer);
  sweepTimer = null;
}
