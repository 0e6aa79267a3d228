// Where one uncached overview answer spends its time, phase by phase, on the benchmark's generated
// build (scripts/bench/api.ts): the SQL round trip (and PostgreSQL's own execution time), the
// computation, the compaction, JSON serialisation and gzip. Run: npm run bench:overview-phases.
import { randomBytes } from 'node:crypto';
import { gzipSync } from 'node:zlib';
import pg from 'pg';

const RUNS = Number(process.env.BENCH_RUNS ?? 40);

async function main() {
  const baseUrl = process.env.DATABASE_URL;
  if (!baseUrl) throw new Error('DATABASE_URL is not set: run through `npm run bench:overview-phases`');
  const dbName = `phases_${randomBytes(4).toString('hex')}`;
  const admin = new URL(baseUrl);
  admin.pathname = '/postgres';
  const adminClient = new pg.Client({ connectionString: admin.toString() });
  await adminClient.connect();
  await adminClient.query(`CREATE DATABASE ${dbName}`);
  const url = new URL(baseUrl);
  url.pathname = `/${dbName}`;
  try {
    Object.assign(process.env, {
      DATABASE_URL: url.toString(),
      NODE_ENV: 'production',
      LOG_LEVEL: 'warn',
      ALLOWED_HOSTS: '127.0.0.1',
    });
    const { migrate } = await import('../../server/db/migrate');
    const { sequelize, Build } = await import('../../server/models');
    const { generate } = await import('./api');
    const { loadOverviewData, loadOverviewLabour, OVERVIEW_SQL } = await import('../../server/services/overviewQuery');
    const { computeOverview } = await import('../../server/services/overview');
    const { compactOverview } = await import('../../shared/overview');
    await migrate();
    const build = await Build.create({
      slug: 'phases',
      name: 'Phases',
      year: 2019,
      make: 'Halvorsen',
      model: 'Tern',
      vin: null,
      mileage: null,
      budgetCents: 4_500_000_00,
      labourRateCents: 9_500,
      campaign: null,
      summary: null,
      startDate: '2025-01-02',
    });
    await generate(build.id, (sql) => sequelize.query(sql));
    await sequelize.query('ANALYZE');
    const spans: Record<string, number[]> = {
      sql: [],
      compute: [],
      compact: [],
      stringify: [],
      gzip1: [],
      gzip6: [],
      'full JSON': [],
      'full gzip6': [],
      'labour-only sql': [],
    };
    let fullSize = 0;
    let size = 0;
    for (let i = 0; i < RUNS; i++) {
      let t = performance.now();
      const lap = (k: string) => {
        const now = performance.now();
        spans[k].push(now - t);
        t = now;
      };
      const data = await loadOverviewData(build.id);
      lap('sql');
      const o = computeOverview(build, data, '2025-06-01');
      lap('compute');
      const c = compactOverview(o);
      lap('compact');
      const body = Buffer.from(JSON.stringify(c));
      lap('stringify');
      gzipSync(body, { level: 1 });
      lap('gzip1');
      gzipSync(body, { level: 6 });
      lap('gzip6');
      size = body.length;
      // For comparison: the expanded rows as the answer was sent before it travelled compact.
      const full = Buffer.from(JSON.stringify(o));
      lap('full JSON');
      gzipSync(full, { level: 6 });
      lap('full gzip6');
      fullSize = full.length;
      // After a logged hour the cache re-reads only the labour sums (services/overview.ts).
      await loadOverviewLabour(build.id);
      lap('labour-only sql');
    }
    const [plan] = (await sequelize.query(`EXPLAIN (ANALYZE, FORMAT JSON) ${OVERVIEW_SQL}`, { bind: [build.id] })) as [
      Array<{ 'QUERY PLAN': Array<{ 'Execution Time': number }> }>,
      unknown,
    ];
    if (process.env.BENCH_PLAN) {
      const [text] = (await sequelize.query(`EXPLAIN (ANALYZE) ${OVERVIEW_SQL}`, { bind: [build.id] })) as [
        Array<{ 'QUERY PLAN': string }>,
        unknown,
      ];
      console.log(text.map((r) => r['QUERY PLAN']).join('\n'));
    }
    const med = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
    console.log(
      `answer ${(size / 1024).toFixed(1)} KiB (expanded rows: ${(fullSize / 1024).toFixed(1)} KiB); medians over ${RUNS} runs (ms):`,
    );
    for (const [k, xs] of Object.entries(spans)) console.log(`  ${k.padEnd(10)} ${med(xs).toFixed(2)}`);
    console.log(
      `  PostgreSQL execution of the overview query: ${plan[0]['QUERY PLAN'][0]['Execution Time'].toFixed(2)} ms`,
    );
    await sequelize.close();
  } finally {
    await adminClient.query(`DROP DATABASE IF EXISTS ${dbName} WITH (FORCE)`);
    await adminClient.end();
  }
}

main().catch((err) => {
  console.error('[bench:overview-phases]', err);
  process.exitCode = 1;
});
