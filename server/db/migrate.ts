// Migrations (schema) and seeders (demo data), both through umzug, each recorded once.
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Umzug, SequelizeStorage } from 'umzug';
import type { QueryInterface } from 'sequelize';
import { sequelize } from './sequelize';

const here = path.dirname(fileURLToPath(import.meta.url));

export type MigrationContext = { queryInterface: QueryInterface; sequelize: typeof sequelize };

function makeUmzug(folder: string, table: string) {
  return new Umzug<MigrationContext>({
    migrations: { glob: ['*.ts', { cwd: path.join(here, folder), ignore: ['*.d.ts'] }] },
    context: { queryInterface: sequelize.getQueryInterface(), sequelize },
    storage: new SequelizeStorage({ sequelize, tableName: table }),
    logger: undefined,
  });
}

export async function migrate(): Promise<string[]> {
  const done = await makeUmzug('migrations', 'schema_migrations').up();
  return done.map((m) => m.name);
}

/** Seeds the demo data; each seeder runs once per database, so a second run adds nothing. */
export async function seedDemo(): Promise<string[]> {
  const done = await makeUmzug('seeders', 'seed_runs').up();
  return done.map((m) => m.name);
}
