// The start script's idempotence: migrations and the demo seed run twice leave the same rows.
import { describe, it, expect } from 'vitest';
import { readdirSync } from 'node:fs';
import path from 'node:path';
import { migrate, nothingPending, seedDemo } from '../../server/db/migrate';
import { sequelize } from '../../server/models';

async function tableCounts() {
  const [tables] = await sequelize.query(
    `SELECT tablename FROM pg_tables WHERE schemaname = 'public' AND tablename NOT IN ('session') ORDER BY tablename`,
  );
  const out: Record<string, number> = {};
  for (const { tablename } of tables as { tablename: string }[]) {
    const [[row]] = (await sequelize.query(`SELECT count(*)::int AS n FROM "${tablename}"`)) as [
      { n: number }[],
      unknown,
    ];
    out[tablename] = row.n;
  }
  return out;
}

describe('migrations and demo seed', () => {
  it('a second run adds nothing', async () => {
    const before = await tableCounts();
    expect(before.users).toBeGreaterThanOrEqual(4);
    expect(await migrate()).toEqual([]);
    expect(await seedDemo()).toEqual([]);
    expect(await tableCounts()).toEqual(before);
  });

  it('migrations and seeders never share a file name (both are recorded in schema_migrations)', () => {
    const names = (folder: string) =>
      readdirSync(path.resolve(import.meta.dirname, '../../server/db', folder)).filter((f) => f.endsWith('.ts'));
    const migrations = new Set(names('migrations'));
    expect(names('seeders').length).toBeGreaterThan(0);
    expect(names('seeders').filter((f) => migrations.has(f))).toEqual([]);
  });

  it('a start with nothing left to run skips the runner; one file not yet recorded is seen', async () => {
    expect(await nothingPending('migrations', 'schema_migrations')).toBe(true);
    expect(await nothingPending('seeders', 'schema_migrations')).toBe(true);
    // A table that does not exist yet (a fresh database) leaves everything to run.
    expect(await nothingPending('migrations', 'no_such_table')).toBe(false);
    // The last demo seeder not recorded: the check sees it (and umzug would run it).
    const last = {
      name: readdirSync(path.resolve(import.meta.dirname, '../../server/db/seeders'))
        .filter((f) => f.endsWith('.ts'))
        .sort()
        .at(-1)!,
    };
    await sequelize.query(`DELETE FROM schema_migrations WHERE name = :name`, { replacements: { name: last.name } });
    expect(await nothingPending('seeders', 'schema_migrations')).toBe(false);
    await sequelize.query(`INSERT INTO schema_migrations (name) VALUES (:name)`, { replacements: { name: last.name } });
    expect(await nothingPending('seeders', 'schema_migrations')).toBe(true);
  });
});
