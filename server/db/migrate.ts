// Migrations (schema) and seeders (demo data), both through umzug, each recorded once.
// Several instances starting together migrate one at a time: each takes a PostgreSQL advisory
// lock first, so the first one migrates and the others find nothing left to do.
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import { Umzug, SequelizeStorage } from 'umzug';
import type { QueryInterface } from 'sequelize';
import { sequelize } from './sequelize';
import { config } from '../config';

// In the sources this file is server/db/migrate.ts and the folders sit beside it; in the compiled
// server (npm run build) the code is build/server/index.js with build/server/migrations/*.js.
const here = path.dirname(fileURLToPath(import.meta.url));

export type MigrationContext = { queryInterface: QueryInterface; sequelize: typeof sequelize };

/** The lock every starting instance takes around migrate() and seedDemo() (any fixed number). */
export const MIGRATION_LOCK_ID = 4_172_026_310;

function makeUmzug(folder: string, table: string) {
  return new Umzug<MigrationContext>({
    migrations: {
      glob: ['*.{ts,js}', { cwd: path.join(here, folder), ignore: ['*.d.ts'] }],
      // Recorded under the source name (.ts), so the compiled server sees the migrations the
      // TypeScript run already made as done.
      resolve: (p) => ({ ...Umzug.defaultResolver(p), name: p.name.replace(/\.js$/, '.ts') }),
    },
    context: { queryInterface: sequelize.getQueryInterface(), sequelize },
    storage: new SequelizeStorage({ sequelize, tableName: table }),
    logger: undefined,
  });
}

/** Runs `work` while holding the migration lock on a connection of its own. */
export async function withMigrationLock<T>(work: () => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: config().DATABASE_URL });
  client.on('error', () => undefined);
  await client.connect();
  try {
    await client.query('SELECT pg_advisory_lock($1)', [MIGRATION_LOCK_ID]);
    try {
      return await work();
    } finally {
      await client.query('SELECT pg_advisory_unlock($1)', [MIGRATION_LOCK_ID]).catch(() => undefined);
    }
  } finally {
    await client.end().catch(() => undefined);
  }
}

export async function migrate(): Promise<string[]> {
  return withMigrationLock(async () => {
    const done = await makeUmzug('migrations', 'schema_migrations').up();
    return done.map((m) => m.name);
  });
}

/** Seeds the demo data; each seeder runs once per database, so a second run adds nothing. */
export async function seedDemo(): Promise<string[]> {
  return withMigrationLock(async () => {
    const done = await makeUmzug('seeders', 'seed_runs').up();
    return done.map((m) => m.name);
  });
}
