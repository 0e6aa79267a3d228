// API benchmark (DESIGN §8): GET /api/builds/:id/overview on a build of 300 upgrades, 3,000 parts and
// 10,000 labour entries, against a bare route running `SELECT 1` on the same pool, in one run.
// Run: npm run bench:api. It makes a fresh database, serves the app from a child process on a free
// loopback port, loads it with autocannon (50 connections, BENCH_SECONDS each), and drops the database.
// Knobs: BENCH_SECONDS (10), BENCH_ROUNDS (5), BENCH_GZIP=0 (ask for identity bodies), OVERVIEW_CACHE=0
// (measure only the uncached path), BENCH_CPU_PROFILE=<dir> (write the server's CPU profile there).
// Besides the cached overview it measures, in the same run: the overview from a second server with
// OVERVIEW_CACHE=0 (every request computes), and a mixed load — 50 readers while one writer logs an
// hour every 200 ms, so each change drops the cached copy as a shop day does.
import { fork, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { fileURLToPath } from 'node:url';
import { readFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import pg from 'pg';
import type autocannon from 'autocannon';

const SECONDS = Number(process.env.BENCH_SECONDS ?? 10);
const CONNECTIONS = 50;
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 5);
const TARGET_P95_MS = 50;
const TARGET_RATIO = 0.4;
const TARGET_UNCACHED_RATIO = 0.1;
const TARGET_MIXED_P95_MS = 60;
const WRITE_EVERY_MS = 200;

// ---------- the server side (child process) ----------
async function serve() {
  const express = (await import('express')).default;
  const { createApp } = await import('../../server/app');
  const { sequelize } = await import('../../server/models');
  // As server/index.ts does: other instances' changes to people and sessions are heard.
  (await import('../../server/services/userNotices')).startUserNotices();
  const outer = express();
  // The bare route: no session, no helmet, one trivial query on the pool the overview uses.
  outer.get('/bench/bare', async (_req, res) => {
    await sequelize.query('SELECT 1');
    res.json({ ok: true });
  });
  // How many overview answers came from the cache, reported to the parent at the end.
  const cache = { hit: 0, miss: 0 };
  outer.use((_req, res, next) => {
    res.on('finish', () => {
      const h = res.getHeader('x-overview-cache');
      if (h === 'hit' || h === 'miss') cache[h] += 1;
    });
    next();
  });
  process.on('message', (m) => m === 'stats' && process.send!({ cache }));
  outer.use(createApp());
  const server = outer.listen(0, '127.0.0.1', () => process.send!({ port: (server.address() as AddressInfo).port }));
  process.on('disconnect', () => process.exit(0));
  process.on('SIGTERM', () => process.exit(0));
}

// ---------- the generated build ----------
export async function generate(buildId: number, q: (sql: string) => Promise<unknown>) {
  const b = String(buildId);
  // Deterministic: every value is a function of the row number, so each run measures the same build.
  await q(`INSERT INTO episodes (build_id, number, title, state, shoot_date, release_date)
    SELECT ${b}, n, 'Episode ' || n,
           CASE WHEN n <= 12 THEN 'live' WHEN n <= 14 THEN 'in_edit' WHEN n <= 20 THEN 'scheduled' ELSE 'draft' END,
           DATE '2025-01-10' + (n - 1) * 7, DATE '2025-01-17' + (n - 1) * 7
      FROM generate_series(1, 40) n`);
  await q(`INSERT INTO upgrades (build_id, title, area, estimated_hours, value_added_cents, priority, episode_id,
             episode_position, install_state, install_segment, demo_segment, installed_on)
    SELECT ${b}, 'Generated upgrade ' || i,
           (ARRAY['front','sides','rear','cabin','electrical','wheels_chassis'])[1 + i % 6],
           (i % 9) * 0.75, 5000 + (i * 7919) % 250000, 1 + i % 5, e.id, i / 40,
           CASE WHEN e.number <= 14 THEN 'installed' WHEN e.number <= 16 THEN 'in_bay' ELSE 'queued' END,
           CASE WHEN e.number <= 14 THEN 'shot' ELSE 'not_shot' END,
           CASE WHEN e.number <= 13 THEN 'shot' ELSE 'not_shot' END,
           CASE WHEN e.number <= 14 THEN e.shoot_date END
      FROM generate_series(0, 299) i
      JOIN episodes e ON e.build_id = ${b} AND e.number = 1 + i % 40`);
  const ups = `(SELECT u.id, e.shoot_date, row_number() OVER (ORDER BY u.id) - 1 AS k
                  FROM upgrades u JOIN episodes e ON e.id = u.episode_id WHERE u.build_id = ${b})`;
  await q(`INSERT INTO parts (build_id, upgrade_id, part_number, description, quantity, unit_cost_cents, retail_price_cents,
             supplier, condition, expected_arrival, ordered_on, received_on, state)
    SELECT ${b}, u.id, 'GX-' || g, 'Generated part ' || g, 1 + g % 3, 500 + (g * 7919) % 60000, 900 + (g * 7919) % 90000,
           'Supplier ' || (g % 7), CASE WHEN g % 5 = 0 THEN 'take_off' ELSE 'new' END, u.shoot_date - 5,
           CASE WHEN g % 6 <> 0 THEN u.shoot_date - 20 END, CASE WHEN g % 3 = 0 THEN u.shoot_date - 6 END,
           (ARRAY['to_order','ordered','backordered','received','fitted','returned'])[1 + g % 6]
      FROM generate_series(0, 2999) g JOIN ${ups} u ON u.k = g % 300`);
  await q(`INSERT INTO labour_entries (build_id, upgrade_id, person_name, worked_on, hours, kind)
    SELECT ${b}, u.id, 'Bay tech ' || (g % 3), u.shoot_date - (g % 12), 0.25 + (g % 16) * 0.25,
           (ARRAY['install','filming','prep'])[1 + g % 3]
      FROM generate_series(0, 9999) g JOIN ${ups} u ON u.k = g % 300`);
  await q(`INSERT INTO expenses (build_id, upgrade_id, description, amount_cents, spent_on, category)
    SELECT ${b}, CASE WHEN g % 4 = 0 THEN NULL ELSE u.id END, 'Generated expense ' || g, 300 + (g * 131) % 20000, u.shoot_date - 3, 'consumables'
      FROM generate_series(0, 599) g JOIN ${ups} u ON u.k = g % 300`);
  await q(`INSERT INTO removed_parts (build_id, upgrade_id, description, disposition, expected_sale_cents, actual_sale_cents, sold_on)
    SELECT ${b}, u.id, 'Stock part ' || g, (ARRAY['keep','for_sale','sold','scrapped'])[1 + g % 4],
           2000 + (g * 97) % 30000, CASE WHEN g % 4 = 2 THEN 1500 + (g * 97) % 28000 END, CASE WHEN g % 4 = 2 THEN u.shoot_date + 30 END
      FROM generate_series(0, 299) g JOIN ${ups} u ON u.k = g`);
}

// ---------- the load ----------
interface Figures {
  p50: number;
  p95: number;
  p99: number;
  rps: number;
  requests: number;
  /** Server CPU per request (µs): independent of what else the machine is doing. */
  cpuUsPerRequest: number;
  non2xx: number;
  errors: number;
}

/** Load of one route for `seconds`; the raw latencies are returned so rounds can be merged. */
/** CPU time the server process has used so far, in ms (Linux /proc; 0 elsewhere). */
function serverCpuMs(pid: number | undefined): number {
  try {
    const f = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
    return ((Number(f[11]) + Number(f[12])) * 1000) / 100; // utime + stime, in clock ticks of 1/100 s
  } catch {
    return 0;
  }
}
let serverPid: number | undefined;

async function round(url: string, headers: Record<string, string>, seconds: number, pid = serverPid) {
  const cpu0 = serverCpuMs(pid);
  const autocannon = (await import('autocannon')).default;
  const latencies: number[] = [];
  const inst = autocannon({
    url,
    connections: CONNECTIONS,
    duration: seconds,
    headers,
    timeout: 10,
  }) as unknown as Promise<autocannon.Result> & { on: (ev: 'response', fn: (...a: never[]) => void) => void };
  inst.on('response', (_c: unknown, _status: number, _bytes: number, ms: number) => latencies.push(ms));
  const r = await inst;
  return {
    latencies,
    requests: r.requests.total,
    non2xx: r.non2xx,
    errors: r.errors + r.timeouts,
    cpuMs: serverCpuMs(pid) - cpu0,
  };
}

function figures(rounds: Awaited<ReturnType<typeof round>>[], seconds: number): Figures {
  const latencies = rounds.flatMap((r) => r.latencies).sort((a, b) => a - b);
  const pct = (p: number) =>
    latencies.length ? latencies[Math.min(latencies.length - 1, Math.ceil((p / 100) * latencies.length) - 1)] : NaN;
  const requests = rounds.reduce((s, r) => s + r.requests, 0);
  const cpuMs = rounds.reduce((s, r) => s + r.cpuMs, 0);
  return {
    p50: pct(50),
    p95: pct(95),
    p99: pct(99),
    rps: requests / seconds,
    requests,
    cpuUsPerRequest: requests ? (cpuMs * 1000) / requests : NaN,
    non2xx: rounds.reduce((s, r) => s + r.non2xx, 0),
    errors: rounds.reduce((s, r) => s + r.errors, 0),
  };
}

/**
 * The routes take turns in short rounds (ROUNDS × SECONDS/ROUNDS each) rather than one long run
 * after the other, so a change in the machine's other load during the run falls on all of them alike.
 */
interface Target {
  name: string;
  url: string;
  headers: Record<string, string>;
  /** Starts something that runs beside the load (the writer); returns its stop. */
  beside?: () => () => Promise<void>;
  /** The server process answering (for its CPU time); default the main one. */
  pid?: number;
}
async function compare(targets: Target[]) {
  const per = SECONDS / ROUNDS;
  const got = new Map<string, Awaited<ReturnType<typeof round>>[]>(targets.map((t) => [t.name, []]));
  for (let i = 0; i < ROUNDS; i++)
    for (const t of targets) {
      const stop = t.beside?.();
      got.get(t.name)!.push(await round(t.url, t.headers, per, t.pid));
      await stop?.();
    }
  return new Map(targets.map((t) => [t.name, figures(got.get(t.name)!, SECONDS)]));
}

/** One writer logging an hour every WRITE_EVERY_MS through the API, as the shop floor does. */
function writer(
  url: string,
  headers: Record<string, string>,
  upgradeId: number,
  counts: { ok: number; failed: number },
) {
  return () => {
    let day = 0;
    const inFlight = new Set<Promise<void>>();
    const timer = setInterval(() => {
      const workedOn = new Date(Date.UTC(2025, 0, 2 + (day++ % 300))).toISOString().slice(0, 10);
      const p = fetch(url, {
        method: 'POST',
        headers: { ...headers, 'content-type': 'application/json' },
        body: JSON.stringify({ upgradeId, workedOn, hours: 1, personName: 'Bench writer' }),
      })
        .then((r) => void (r.ok ? counts.ok++ : counts.failed++))
        .catch(() => void counts.failed++)
        .finally(() => inFlight.delete(p));
      inFlight.add(p);
    }, WRITE_EVERY_MS);
    return async () => {
      clearInterval(timer);
      await Promise.all(inFlight);
    };
  };
}

async function startServer(env: NodeJS.ProcessEnv) {
  const child = fork(fileURLToPath(import.meta.url), ['--serve'], {
    env,
    execArgv: [
      '--import',
      'tsx',
      ...(process.env.BENCH_CPU_PROFILE ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_CPU_PROFILE}`] : []),
    ],
    stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
  });
  const port = await new Promise<number>((resolve, reject) => {
    child.once('message', (m: { port: number }) => resolve(m.port));
    child.once('exit', (code) => reject(new Error(`the server exited with ${code}`)));
  });
  return { child, base: `http://127.0.0.1:${port}` };
}

async function signIn(base: string) {
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', 'X-Requested-With': 'Bayslate' },
    body: JSON.stringify({ email: 'owner@cedar-ridge.test', password: 'bayslate-demo' }),
  });
  if (!login.ok) throw new Error(`sign-in answered ${login.status}`);
  return login.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}

async function warm(url: string, headers: Record<string, string>) {
  const autocannon = (await import('autocannon')).default;
  await autocannon({ url, connections: 10, duration: 2, headers });
}

async function main() {
  const baseUrl = process.env.DATABASE_URL;
  if (!baseUrl) throw new Error('DATABASE_URL is not set: run through `npm run bench:api`');
  const dbName = `bench_${randomBytes(4).toString('hex')}`;
  const admin = new URL(baseUrl);
  admin.pathname = '/postgres';
  const adminClient = new pg.Client({ connectionString: admin.toString() });
  await adminClient.connect();
  await adminClient.query(`CREATE DATABASE ${dbName}`);
  const benchUrl = new URL(baseUrl);
  benchUrl.pathname = `/${dbName}`;
  let child: ChildProcess | null = null;
  const children: ChildProcess[] = [];
  try {
    // Everything below reads its settings from this environment (server/config.ts).
    Object.assign(process.env, {
      DATABASE_URL: benchUrl.toString(),
      NODE_ENV: 'production',
      BAYSLATE_DEMO: '1',
      SERVE_CLIENT: '0',
      MAIL_WORKER: '0',
      LOG_REQUESTS: '0',
      LOG_LEVEL: 'warn',
      ALLOWED_HOSTS: '127.0.0.1',
      DATABASE_POOL_MAX: process.env.DATABASE_POOL_MAX ?? '10',
    });
    const { migrate } = await import('../../server/db/migrate');
    const { sequelize, Build } = await import('../../server/models');
    await migrate();
    // Only the demo people (to sign in with; they sign in in demo mode only); the benchmark's build is generated below.
    const { up: seedUsers } = await import('../../server/db/seeders/0001-demo-users');
    await seedUsers({ context: { sequelize, queryInterface: sequelize.getQueryInterface() } });
    const build = await Build.create({
      slug: 'bench-build',
      name: 'Benchmark build',
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
    const t0 = performance.now();
    await generate(build.id, (sql) => sequelize.query(sql));
    await sequelize.query('ANALYZE');
    const [[n]] = (await sequelize.query(
      `SELECT (SELECT count(*) FROM upgrades WHERE build_id = ${build.id})::int AS upgrades, (SELECT count(*) FROM parts WHERE build_id = ${build.id})::int AS parts,
              (SELECT count(*) FROM labour_entries WHERE build_id = ${build.id})::int AS labour`,
    )) as [Array<{ upgrades: number; parts: number; labour: number }>, unknown];
    const [[{ id: firstUpgrade }]] = (await sequelize.query(
      `SELECT min(id) AS id FROM upgrades WHERE build_id = ${build.id}`,
    )) as [Array<{ id: number }>, unknown];
    console.log(
      `generated ${n.upgrades} upgrades, ${n.parts} parts, ${n.labour} labour entries in ${Math.round(performance.now() - t0)} ms (database ${dbName})`,
    );
    await sequelize.close();

    // Two servers on the same database: one as configured (cache on unless OVERVIEW_CACHE=0), one
    // with the cache off, so cached, uncached and mixed figures come from the same run and machine.
    const onlyUncached = process.env.OVERVIEW_CACHE === '0';
    const main = await startServer(process.env);
    child = main.child;
    serverPid = child.pid;
    const uncachedServer = onlyUncached ? main : await startServer({ ...process.env, OVERVIEW_CACHE: '0' });
    if (uncachedServer !== main) children.push(uncachedServer.child);
    const base = main.base;
    const cookie = await signIn(base);
    const cookieUncached = uncachedServer === main ? cookie : await signIn(uncachedServer.base);
    // As a browser sends them: the session cookie and gzip accepted.
    const headers: Record<string, string> = { cookie, 'x-requested-with': 'Bayslate' };
    if (process.env.BENCH_GZIP !== '0') headers['accept-encoding'] = 'gzip, deflate, br';
    const headersUncached = { ...headers, cookie: cookieUncached };
    const overviewUrl = `${base}/api/builds/${build.id}/overview`;
    const uncachedUrl = `${uncachedServer.base}/api/builds/${build.id}/overview`;
    const check = await fetch(overviewUrl, { headers });
    if (!check.ok) throw new Error(`overview answered ${check.status}`);
    const body = await check.text();
    console.log(`overview response: ${(body.length / 1024).toFixed(1)} KiB`);

    await warm(overviewUrl, headers);
    const cacheState = (await fetch(overviewUrl, { headers })).headers.get('x-overview-cache');
    console.log(`overview cache after warm-up: ${cacheState}`);
    await warm(uncachedUrl, headersUncached);
    await warm(`${base}/bench/bare`, {});
    const writes = { ok: 0, failed: 0 };
    const targets: Target[] = [
      { name: 'overview', url: overviewUrl, headers },
      { name: 'bare', url: `${base}/bench/bare`, headers: {} },
      // For reading the figures: what a signed-in request costs before any feature runs.
      { name: 'me', url: `${base}/api/auth/me`, headers },
    ];
    if (!onlyUncached) {
      targets.push({ name: 'uncached', url: uncachedUrl, headers: headersUncached, pid: uncachedServer.child.pid });
      targets.push({
        name: 'mixed',
        url: overviewUrl,
        headers,
        beside: writer(`${base}/api/builds/${build.id}/labour`, headers, firstUpgrade, writes),
      });
    }
    const results = await compare(targets);
    const overview = results.get('overview')!;
    const bare = results.get('bare')!;
    const me = results.get('me')!;
    const uncached = results.get('uncached');
    const mixed = results.get('mixed');
    const ratio = overview.rps / bare.rps;
    const stats = await new Promise<{ cache: { hit: number; miss: number } }>((resolve) => {
      child!.once('message', (m) => resolve(m as { cache: { hit: number; miss: number } }));
      child!.send('stats');
    });
    const row = (name: string, f: Figures) =>
      `${name.padEnd(26)} ${f.p50.toFixed(1).padStart(7)} ${f.p95.toFixed(1).padStart(7)} ${f.p99.toFixed(1).padStart(7)} ${f.rps.toFixed(0).padStart(8)} ${f.cpuUsPerRequest.toFixed(0).padStart(9)} ${String(f.non2xx + f.errors).padStart(7)}`;
    console.log(
      `\n${CONNECTIONS} connections, ${SECONDS} s each (${ROUNDS} alternating rounds), loopback, OVERVIEW_CACHE=${process.env.OVERVIEW_CACHE ?? '1'}`,
    );
    console.log(
      `${'route'.padEnd(26)} ${'p50 ms'.padStart(7)} ${'p95 ms'.padStart(7)} ${'p99 ms'.padStart(7)} ${'req/s'.padStart(8)} ${'cpu µs/r'.padStart(9)} ${'failed'.padStart(7)}`,
    );
    console.log(row(onlyUncached ? 'GET overview (uncached)' : 'GET overview (cached)', overview));
    if (uncached) console.log(row('GET overview (uncached)', uncached));
    if (mixed) console.log(row('GET overview (mixed)', mixed));
    console.log(row('bare SELECT 1', bare));
    console.log(row('signed-in /api/auth/me', me));
    console.log(
      `overview answers from the cache: ${stats.cache.hit} of ${stats.cache.hit + stats.cache.miss} (the mixed run included)`,
    );
    let met = overview.non2xx + overview.errors === 0;
    if (onlyUncached) {
      console.log(
        `uncached throughput ratio: ${(ratio * 100).toFixed(1)} % (target ≥ ${TARGET_UNCACHED_RATIO * 100} %)`,
      );
      met &&= ratio >= TARGET_UNCACHED_RATIO;
    } else {
      const uRatio = uncached!.rps / bare.rps;
      console.log(`cached throughput ratio: ${(ratio * 100).toFixed(1)} % (target ≥ ${TARGET_RATIO * 100} %)`);
      console.log(`cached p95: ${overview.p95.toFixed(1)} ms (target < ${TARGET_P95_MS} ms)`);
      console.log(
        `uncached throughput ratio: ${(uRatio * 100).toFixed(1)} % (target ≥ ${TARGET_UNCACHED_RATIO * 100} %)`,
      );
      console.log(
        `mixed p95: ${mixed!.p95.toFixed(1)} ms (target < ${TARGET_MIXED_P95_MS} ms); hours logged ${writes.ok}, failed writes ${writes.failed}`,
      );
      met &&=
        overview.p95 < TARGET_P95_MS &&
        ratio >= TARGET_RATIO &&
        uRatio >= TARGET_UNCACHED_RATIO &&
        mixed!.p95 < TARGET_MIXED_P95_MS;
      met &&=
        uncached!.non2xx + uncached!.errors + mixed!.non2xx + mixed!.errors === 0 &&
        writes.failed === 0 &&
        writes.ok > 0;
    }
    console.log(met ? 'targets met' : 'targets NOT met');
    process.exitCode = met ? 0 : 1;
  } finally {
    for (const c of [child, ...children]) {
      if (!c || c.exitCode !== null) continue;
      const exited = new Promise((r) => c.once('exit', r));
      c.kill('SIGTERM');
      await exited;
    }
    await adminClient.query(`DROP DATABASE IF EXISTS ${dbName} WITH (FORCE)`);
    await adminClient.end();
  }
}

if (process.argv.includes('--serve')) {
  serve().catch((err) => {
    console.error(err);
    process.exit(1);
  });
} else if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  main().catch((err) => {
    console.error('[bench:api]', err?.message ?? err);
    process.exitCode = 1;
  });
}
