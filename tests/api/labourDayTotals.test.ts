// labour_day_totals (migration 0033): the per-upgrade, per-day sums the overview reads stay equal to
// the labour entries through inserts, edits that move an entry to another day or upgrade, deletes
// and an upgrade's deletion (its entries cascade).
import { describe, it, expect } from 'vitest';
import { QueryTypes } from 'sequelize';
import { Build, Upgrade, sequelize } from '../../server/models';

const q = <T extends object>(sql: string, bind: unknown[] = []) =>
  sequelize.query<T>(sql, { bind, type: QueryTypes.SELECT });

/** The sums kept by the triggers against the sums worked out from the entries, for one build. */
async function compare(buildId: number) {
  const kept = await q<{ upgrade_id: number; day: string; hours: number; entries: number }>(
    `SELECT upgrade_id, to_char(worked_on, 'YYYY-MM-DD') AS day, hours::float8 AS hours, entries FROM labour_day_totals WHERE build_id = $1 ORDER BY 1, 2`,
    [buildId],
  );
  const summed = await q<{ upgrade_id: number; day: string; hours: number; entries: number }>(
    `SELECT upgrade_id, to_char(worked_on, 'YYYY-MM-DD') AS day, sum(hours::numeric)::float8 AS hours, count(*)::int AS entries FROM labour_entries WHERE build_id = $1 GROUP BY 1, 2 ORDER BY 1, 2`,
    [buildId],
  );
  return { kept, summed };
}

describe('labour day totals', () => {
  it('follow every insert, move, edit and delete of labour entries', async () => {
    const b = await Build.create({
      slug: 'labour-totals',
      name: 'Labour totals',
      year: 2020,
      make: 'Halvorsen',
      model: 'Tern',
      vin: null,
      mileage: null,
      campaign: null,
      summary: null,
      budgetCents: 100_000,
      labourRateCents: 10_000,
    } as never);
    const mk = (title: string) =>
      Upgrade.create({
        buildId: b.id,
        title,
        area: 'front',
        estimatedHours: 2,
        replaces: null,
        becomes: null,
        episodeId: null,
        episodePosition: null,
        notes: null,
        tireFrom: null,
        tireTo: null,
        installedOn: null,
      } as never);
    const [a, c] = [await mk('Grille'), await mk('Fog lamps')];
    const log = async (upgradeId: number, day: string, hours: number) =>
      (
        await q<{ id: number }>(
          `INSERT INTO labour_entries (build_id, upgrade_id, person_name, worked_on, hours) VALUES ($1,$2,'Bay tech',$3,$4) RETURNING id`,
          [b.id, upgradeId, day, hours],
        )
      )[0].id;
    const e1 = await log(a.id, '2026-02-02', 0.1);
    await log(a.id, '2026-02-02', 0.2);
    const e3 = await log(a.id, '2026-02-03', 1.5);
    await log(c.id, '2026-02-02', 2.25);
    // By hand: Grille 0.1 + 0.2 = 0.3 h on the 2nd (two entries), 1.5 h on the 3rd; Fog lamps 2.25 h on the 2nd.
    let { kept, summed } = await compare(b.id);
    expect(kept).toEqual([
      { upgrade_id: a.id, day: '2026-02-02', hours: 0.3, entries: 2 },
      { upgrade_id: a.id, day: '2026-02-03', hours: 1.5, entries: 1 },
      { upgrade_id: c.id, day: '2026-02-02', hours: 2.25, entries: 1 },
    ]);
    expect(kept).toEqual(summed);
    // Moved to another day and upgrade, with new hours; then one deleted: the 3rd empties.
    await sequelize.query(
      `UPDATE labour_entries SET worked_on = '2026-02-04', upgrade_id = $2, hours = 0.75 WHERE id = $1`,
      { bind: [e3, c.id] },
    );
    await sequelize.query(`DELETE FROM labour_entries WHERE id = $1`, { bind: [e1] });
    ({ kept, summed } = await compare(b.id));
    expect(kept).toEqual([
      { upgrade_id: a.id, day: '2026-02-02', hours: 0.2, entries: 1 },
      { upgrade_id: c.id, day: '2026-02-02', hours: 2.25, entries: 1 },
      { upgrade_id: c.id, day: '2026-02-04', hours: 0.75, entries: 1 },
    ]);
    expect(kept).toEqual(summed);
    // Deleting an upgrade takes its entries, and their sums, with it.
    await sequelize.query(`DELETE FROM upgrades WHERE id = $1`, { bind: [c.id] });
    ({ kept, summed } = await compare(b.id));
    expect(kept).toEqual([{ upgrade_id: a.id, day: '2026-02-02', hours: 0.2, entries: 1 }]);
    expect(kept).toEqual(summed);
  });

  it('hold for every build of the seeded database', async () => {
    const builds = await q<{ id: number }>('SELECT id FROM builds');
    expect(builds.length).toBeGreaterThan(0);
    for (const { id } of builds) {
      const { kept, summed } = await compare(id);
      expect(kept, `build ${id}`).toEqual(summed);
    }
  });
});
