// Direct database access for tests: row counts and raw checks, on this file's own database.
import { sequelize } from '../../server/models';

export async function count(table: string): Promise<number> {
  const [rows] = await sequelize.query(`SELECT count(*)::int AS n FROM ${table}`);
  return (rows as { n: number }[])[0].n;
}

/** Row counts of several tables, to assert that a refused request wrote nothing. */
export async function counts(...tables: string[]): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const t of tables) out[t] = await count(t);
  return out;
}
