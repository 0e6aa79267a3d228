// The plain pg pool beside Sequelize's: sessions (connect-pg-simple) and the shared rate-limit
// counters use it. It has an 'error' listener: an idle client that PostgreSQL drops (a restart,
// a fail-over: 57P01) is discarded by the pool instead of taking the process down.
import pg from 'pg';
import { config } from '../config';

let pool: pg.Pool | null = null;
let lastLogged = 0;

/** Logs a dropped connection at most once every 10 s (a restart drops them all at once). */
export function logPoolError(name: string) {
  return (err: Error & { code?: string }) => {
    if (Date.now() - lastLogged < 10_000) return;
    lastLogged = Date.now();
    console.error(
      `[bayslate] ${name}: a database connection was lost (${err.code ?? err.message}); new requests reconnect`,
    );
  };
}

export function sharedPool(): pg.Pool {
  if (pool) return pool;
  const c = config();
  pool = new pg.Pool({
    connectionString: c.DATABASE_URL,
    max: c.DATABASE_POOL_MAX,
    connectionTimeoutMillis: 5000,
    idleTimeoutMillis: 30_000,
  });
  pool.on('error', logPoolError('session pool'));
  return pool;
}

export async function closeSharedPool() {
  const p = pool;
  pool = null;
  await p?.end().catch(() => undefined);
}
