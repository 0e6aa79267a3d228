// Migrations (schema) and seeders (demo data), both through umzug, each recorded once in
// schema_migrations. (umzug's storage reuses one model per connection, so the seeders were always
// recorded there beside the migrations; their file names never repeat between the two folders.)
// Several instances starting together migrate one at a time: each takes a PostgreSQL advisory
// lock first, so the first one migrates and the others find nothing left to do.
import { existsSync, readdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import { QueryTypes, type QueryInterface } from 'sequelize';
import { sequelize } from './sequelize';
import { config } from '../config';

// In the sources this file is server/db/migrate.ts and the folders sit beside it; in the compiled
// server (npm run build) the code is build/server/index.js with build/server/migrations/*.js.
const here = path.dirname(fileURLToPath(import.meta.url));

export type MigrationContext = { queryInterface: QueryInterface; sequelize: typeof sequelize };

/** The lock every starting instance takes around migrate() and seedDemo() (any fixed number). */
export const MIGRATION_LOCK_ID = 4_172_026_310;

// umzug (and the command-line package it loads) is loaded only when something is left to run: a
// start on an up-to-date database, every start but the first, saves a seventh of a second of CPU.
async function makeUmzug(folder: string, table: string) {
  const { Umzug, SequelizeStorage } = await import('umzug');
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

/** The names umzug records for the files in `folder` (as its glob above: .ts or .js, no .d.ts; .js as .ts). */
function fileNames(folder: string): string[] {
  const dir = path.join(here, folder);
  if (!existsSync(dir)) return [];
  return readdirSync(dir)
    .filter((f) => /\.(ts|js)$/.test(f) && !f.endsWith('.d.ts'))
    .map((f) => f.replace(/\.js$/, '.ts'));
}

/** True when `table` records every file of `folder`: nothing to run, so no lock and no umzug. */
export async function nothingPending(folder: string, table: string): Promise<boolean> {
  const files = fileNames(folder);
  const [{ present }] = await sequelize.query<{ present: boolean }>(
    `SELECT to_regclass(:table) IS NOT NULL AS present`,
    {
      replacements: { table },
      type: QueryTypes.SELECT,
    },
  );
  if (!present) return files.length === 0;
  const rows = await sequelize.query<{ name: string }>(`SELECT name FROM "${table}"`, { type: QueryTypes.SELECT });
  const done = new Set(rows.map((r) => r.name));
  return files.every((f) => done.has(f));
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
  if (await nothingPending('migrations', 'schema_migrations')) return [];
  return withMigrationLock(async () => {
    const done = await (await makeUmzug('migrations', 'schema_migrations')).up();
    return done.map((m) => m.name);
  });
}

/** Seeds the demo data; each seeder runs once per database, so a second run adds nothing. */
export async function seedDemo(): Promise<string[]> {
  if (await nothingPending('seeders', 'schema_migrations')) return [];
  return withMigrationLock(async () => {
    const done = await (await makeUmzug('seeders', 'schema_migrations')).up();
    return done.map((m) => m.name);
  });
}
