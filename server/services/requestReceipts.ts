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
export async function claimReceipt(userId: number, key: string, method: string, path: string): Promise<Claim> {
  const inserted = await sequelize.query<{ key: string }>(
    `INSERT INTO request_receipts (user_id, key, method, path) VALUES (:userId, :key, :method, :path)
     ON CONFLICT (user_id, key) DO NOTHING RETURNING key`,
    { replacements: { userId, key, method, path }, type: QueryTypes.SELECT },
  );
  if (inserted.length) {
    // Now and then, forget receipts older than a week.
    if (Math.random() < 0.02) await sweepReceipts();
    return { state: 'new' };
  }
  const [row] = await sequelize.query<Row>(
    'SELECT method, path, status, body FROM request_receipts WHERE user_id = :userId AND key = :key',
    {
      replacements: { userId, key },
      type: QueryTypes.SELECT,
    },
  );
  if (!row) return claimReceipt(userId, key, method, path); // released meanwhile: try again
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

export async function sweepReceipts() {
  await sequelize.query(`DELETE FROM request_receipts WHERE created_at < now() - interval '${RECEIPT_DAYS} days'`);
}
