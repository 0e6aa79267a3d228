// After each API test file: its database connections end with it (the next file this worker runs
// has a database of its own, and its own freshly evaluated server modules: per-file-db.ts).
import { afterAll } from 'vitest';

afterAll(async () => {
  const { sequelize } = await import('../../server/models');
  await sequelize.close();
});
