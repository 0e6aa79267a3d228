// The start script's idempotence: migrations and the demo seed run twice leave the same rows.
import { describe, it, expect } from 'vitest';
import { migrate, seedDemo } from '../../server/db/migrate';
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
});
