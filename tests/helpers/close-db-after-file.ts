// After each API test file: all its database connections end with it — both pools and the
// listening connections, as at a graceful stop (the next file this worker runs has a database of its
// own, and its own freshly evaluated server modules: per-file-db.ts). Closing only the model layer's
// pool left two or three connections per file open for the worker's life; a worker's files piled
// them up until PostgreSQL refused new connections and a later file's requests answered 503.
import { afterAll } from 'vitest';

afterAll(async () => {
  const { closeDatabaseConnections } = await import('../../server/db/connections');
  await closeDatabaseConnections();
});
