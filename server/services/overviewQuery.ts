// The build overview's data in one SQL round trip: every table summed in the database, grouped by
// upgrade and by date, and sent back as compact JSON arrays (one row, one column per list).
import type pg from 'pg';
import { queryCounter, sequelize } from '../db/sequelize';
import type { Area, Disposition, EpisodeState, InstallState, PartState, SegmentState } from '../../shared/domain';

export interface OverviewData {
  upgrades: {
    id: number;
    title: string;
    area: Area;
    episodeId: number | null;
    estimatedHours: number;
    valueAddedCents: number;
    installState: InstallState;
    installSegment: SegmentState;
    demoSegment: SegmentState;
    installedOn: string | null;
  }[];
  episodes: { id: number; number: number; title: string; state: EpisodeState; shootDate: string | null }[];
  /** Hours per upgrade per day worked. */
  labour: { upgradeId: number; workedOn: string; hours: number }[];
  /** Part lines (returned ones excluded) summed per upgrade, state and dates. */
  parts: {
    upgradeId: number;
    state: PartState;
    orderedOn: string | null;
    receivedOn: string | null;
    fittedOn: string | null;
    cents: number;
  }[];
  /** Latest expected arrival of parts not yet in hand, per upgrade (only where one is set). */
  arrivals: { upgradeId: number; expectedOn: string }[];
  expenses: { upgradeId: number | null; spentOn: string; cents: number }[];
  /** Removed parts sold or for sale, summed per upgrade, disposition and sale date. */
  removed: {
    upgradeId: number | null;
    disposition: Disposition;
    soldOn: string | null;
    expectedCents: number;
    actualCents: number;
  }[];
}

// Arrays instead of objects keep the JSON small and quick to parse; the positions are mapped below.
// Sums of cents are cast to bigint so no integer overflow can occur inside the database. Labour
// comes already summed per upgrade and day (labour_day_totals, kept by triggers: migration 0033).
export const OVERVIEW_SQL = `
WITH
  u AS (SELECT id, title, area, episode_id, estimated_hours, value_added_cents, install_state,
               install_segment, demo_segment, installed_on
          FROM upgrades WHERE build_id = $1),
  e AS (SELECT id, number, title, state, shoot_date FROM episodes WHERE build_id = $1),
  l AS (SELECT upgrade_id, worked_on, hours::float8 AS hours
          FROM labour_day_totals WHERE build_id = $1 ORDER BY upgrade_id, worked_on),
  p AS (SELECT upgrade_id, state, ordered_on, received_on, fitted_on,
               sum(quantity::bigint * unit_cost_cents) AS cents,
               max(expected_arrival) AS expected_on
          FROM parts WHERE build_id = $1 AND state <> 'returned'
         GROUP BY upgrade_id, state, ordered_on, received_on, fitted_on),
  -- Arrivals from the same scan of parts (p is read twice, so PostgreSQL computes it once).
  a AS (SELECT upgrade_id, max(expected_on) AS expected_on
          FROM p WHERE state IN ('to_order','ordered','backordered') AND expected_on IS NOT NULL
         GROUP BY upgrade_id),
  x AS (SELECT upgrade_id, spent_on, sum(amount_cents::bigint) AS cents
          FROM expenses WHERE build_id = $1 GROUP BY upgrade_id, spent_on),
  r AS (SELECT upgrade_id, disposition, sold_on,
               sum(coalesce(expected_sale_cents, 0)::bigint) AS expected,
               sum(coalesce(actual_sale_cents, 0)::bigint) AS actual
          FROM removed_parts WHERE build_id = $1 AND disposition IN ('sold', 'for_sale')
         GROUP BY upgrade_id, disposition, sold_on)
SELECT
  (SELECT coalesce(json_agg(json_build_array(id, title, area, episode_id, estimated_hours, value_added_cents,
          install_state, install_segment, demo_segment, installed_on) ORDER BY id), '[]') FROM u) AS upgrades,
  (SELECT coalesce(json_agg(json_build_array(id, number, title, state, shoot_date) ORDER BY number), '[]') FROM e) AS episodes,
  (SELECT coalesce(json_agg(json_build_array(upgrade_id, worked_on, hours)), '[]') FROM l) AS labour,
  (SELECT coalesce(json_agg(json_build_array(upgrade_id, state, ordered_on, received_on, fitted_on, cents)), '[]') FROM p) AS parts,
  (SELECT coalesce(json_agg(json_build_array(upgrade_id, expected_on)), '[]') FROM a) AS arrivals,
  (SELECT coalesce(json_agg(json_build_array(upgrade_id, spent_on, cents)), '[]') FROM x) AS expenses,
  (SELECT coalesce(json_agg(json_build_array(upgrade_id, disposition, sold_on, expected, actual)), '[]') FROM r) AS removed
`;

type Row = Record<keyof OverviewData, unknown[][]>;

/** How many full reads and labour-only reads ran (tests and benchmarks watch these). */
export const overviewReads = { full: 0, labour: 0 };

/** Only the labour sums, in the same order and form as loadOverviewData gives them. */
export async function loadOverviewLabour(buildId: number): Promise<OverviewData['labour']> {
  overviewReads.labour += 1;
  return prepared<OverviewData['labour'][number]>('overview_labour', LABOUR_SQL, [buildId]);
}

const LABOUR_SQL = `SELECT upgrade_id AS "upgradeId", to_char(worked_on, 'YYYY-MM-DD') AS "workedOn", hours::float8 AS hours
  FROM labour_day_totals WHERE build_id = $1 ORDER BY upgrade_id, worked_on`;

interface ConnectionManager {
  getConnection(options: { type: string }): Promise<pg.ClientBase>;
  releaseConnection(connection: pg.ClientBase): Promise<void>;
}

/**
 * Runs one of the overview's fixed queries as a named prepared statement on a connection of
 * Sequelize's pool: PostgreSQL parses and plans it once per connection instead of on every request
 * (planning alone was ~0.4 ms of the overview query). Counted like every other query.
 */
async function prepared<T>(name: string, text: string, values: unknown[]): Promise<T[]> {
  queryCounter.count += 1;
  const manager = sequelize.connectionManager as unknown as ConnectionManager;
  const connection = await manager.getConnection({ type: 'SELECT' });
  try {
    return (await connection.query<T & pg.QueryResultRow>({ name, text, values })).rows;
  } finally {
    await manager.releaseConnection(connection);
  }
}

export async function loadOverviewData(buildId: number): Promise<OverviewData> {
  overviewReads.full += 1;
  const [row] = await prepared<Row>('overview', OVERVIEW_SQL, [buildId]);
  return {
    upgrades: row.upgrades.map(
      ([
        id,
        title,
        area,
        episodeId,
        estimatedHours,
        valueAddedCents,
        installState,
        installSegment,
        demoSegment,
        installedOn,
      ]) => ({
        id: id as number,
        title: title as string,
        area: area as Area,
        episodeId: episodeId as number | null,
        estimatedHours: estimatedHours as number,
        valueAddedCents: valueAddedCents as number,
        installState: installState as InstallState,
        installSegment: installSegment as SegmentState,
        demoSegment: demoSegment as SegmentState,
        installedOn: installedOn as string | null,
      }),
    ),
    episodes: row.episodes.map(([id, number, title, state, shootDate]) => ({
      id: id as number,
      number: number as number,
      title: title as string,
      state: state as EpisodeState,
      shootDate: shootDate as string | null,
    })),
    labour: row.labour.map(([upgradeId, workedOn, hours]) => ({
      upgradeId: upgradeId as number,
      workedOn: workedOn as string,
      hours: hours as number,
    })),
    parts: row.parts.map(([upgradeId, state, orderedOn, receivedOn, fittedOn, cents]) => ({
      upgradeId: upgradeId as number,
      state: state as PartState,
      orderedOn: orderedOn as string | null,
      receivedOn: receivedOn as string | null,
      fittedOn: fittedOn as string | null,
      cents: Number(cents),
    })),
    arrivals: row.arrivals.map(([upgradeId, expectedOn]) => ({
      upgradeId: upgradeId as number,
      expectedOn: expectedOn as string,
    })),
    expenses: row.expenses.map(([upgradeId, spentOn, cents]) => ({
      upgradeId: upgradeId as number | null,
      spentOn: spentOn as string,
      cents: Number(cents),
    })),
    removed: row.removed.map(([upgradeId, disposition, soldOn, expected, actual]) => ({
      upgradeId: upgradeId as number | null,
      disposition: disposition as Disposition,
      soldOn: soldOn as string | null,
      expectedCents: Number(expected),
      actualCents: Number(actual),
    })),
  };
}
