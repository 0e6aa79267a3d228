// Public page benchmark (issue 10): in one run, the public build JSON, GET /api/health/live and
// the static index.html, from the same server, 50 connections on loopback, as a browser asks
// (gzip accepted). Targets: the public JSON at least 50 % of the static page's throughput, the
// liveness check at least 80 %.
// Run: npm run bench:public. It makes a fresh database with the Project Tern demo build, builds the
// client if dist/ is missing, serves the app (NODE_ENV=production, request logs on, to /dev/null)
// from a child process, and drops the database. Knobs: BENCH_SECONDS (10), BENCH_ROUNDS (5).
import { fork, execFileSync, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';
import { createServer, type AddressInfo } from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';
import type autocannon from 'autocannon';

const SECONDS = Number(process.env.BENCH_SECONDS ?? 10);
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 5);
const CONNECTIONS = 50;
const TARGET_PUBLIC = 0.5;
const TARGET_LIVE = 0.8;
const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

// ---------- the server side (child process) ----------
async function serve() {
  const { createApp } = await import('../../server/app');
  const { config } = await import('../../server/config');
  const server = createApp().listen(config().PORT, '127.0.0.1', () =>
    process.send!({ port: (server.address() as AddressInfo).port }),
  );
  process.on('disconnect', () => process.exit(0));
  process.on('SIGTERM', () => process.exit(0));
}

// ---------- the load ----------
interface Figures {
  /** Server CPU per request (µs): what the route costs, whatever else the machine is doing. */
  cpuUs: number;
  rps: number;
  p50: number;
  p95: number;
  requests: number;
  failed: number;
}

/** CPU time the server process has used so far, in ms (Linux /proc; 0 elsewhere). */
function serverCpuMs(pid: number | undefined): number {
  try {
    const f = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ');
    return ((Number(f[11]) + Number(f[12])) * 1000) / 100; // utime + stime, in ticks of 1/100 s
  } catch {
    return 0;
  }
}
let serverPid: number | undefined;

async function round(url: string, headers: Record<string, string>, seconds: number) {
  const run = (await import('autocannon')).default;
  const cpu0 = serverCpuMs(serverPid);
  const r = (await run({
    url,
    connections: CONNECTIONS,
    duration: seconds,
    headers,
    timeout: 10,
  })) as autocannon.Result;
  return {
    cpuMs: serverCpuMs(serverPid) - cpu0,
    requests: r.requests.total,
    p50: r.latency.p50,
    p95: r.latency.p97_5 ?? r.latency.p99,
    failed: r.non2xx + r.errors + r.timeouts,
  };
}

/** Routes take turns in short rounds, so the machine's other load falls on all of them alike. */
async function compare(targets: { name: string; url: string }[], headers: Record<string, string>) {
  const per = SECONDS / ROUNDS;
  const got = new Map(targets.map((t) => [t.name, [] as Awaited<ReturnType<typeof round>>[]]));
  for (let i = 0; i < ROUNDS; i++) for (const t of targets) got.get(t.name)!.push(await round(t.url, headers, per));
  const out = new Map<string, Figures>();
  for (const t of targets) {
    const rs = got.get(t.name)!;
    const requests = rs.reduce((s, r) => s + r.requests, 0);
    // Median of the rounds' percentiles: autocannon gives no raw latencies to merge.
    const mid = (xs: number[]) => xs.sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
    const cpuMs = rs.reduce((s, r) => s + r.cpuMs, 0);
    out.set(t.name, {
      cpuUs: requests ? (cpuMs * 1000) / requests : NaN,
      rps: requests / SECONDS,
      requests,
      p50: mid(rs.map((r) => r.p50)),
      p95: mid(rs.map((r) => r.p95)),
      failed: rs.reduce((s, r) => s + r.failed, 0),
    });
  }
  return out;
}

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as AddressInfo).port;
      s.close(() => resolve(port));
    });
  });
}

async function main() {
  const baseUrl = process.env.DATABASE_URL;
  if (!baseUrl) throw new Error('DATABASE_URL is not set: run through `npm run bench:public`');
  const dist = path.join(root, 'dist');
  if (!existsSync(path.join(dist, 'index.html'))) {
    console.log('building the client (dist/ is missing)…');
    execFileSync(process.execPath, [path.join(root, 'node_modules/vite/bin/vite.js'), 'build', '--logLevel', 'warn'], {
      cwd: root,
      stdio: 'inherit',
    });
  }
  const dbName = `bench_${randomBytes(4).toString('hex')}`;
  const admin = new URL(baseUrl);
  admin.pathname = '/postgres';
  const adminClient = new pg.Client({ connectionString: admin.toString() });
  await adminClient.connect();
  await adminClient.query(`CREATE DATABASE ${dbName}`);
  const benchUrl = new URL(baseUrl);
  benchUrl.pathname = `/${dbName}`;
  let child: ChildProcess | null = null;
  try {
    const port = await freePort();
    Object.assign(process.env, {
      DATABASE_URL: benchUrl.toString(),
      NODE_ENV: 'production',
      PORT: String(port),
      PUBLIC_URL: `http://127.0.0.1:${port}`,
      VIEWER_KEY_SECRET: process.env.VIEWER_KEY_SECRET ?? randomBytes(32).toString('hex'),
      BAYSLATE_DEMO: '0',
      SERVE_CLIENT: '1',
      CLIENT_DIST: dist,
      MAIL_WORKER: '0',
      S3_ENDPOINT: process.env.S3_ENDPOINT ?? 'http://127.0.0.1:9',
      SMTP_URL: process.env.SMTP_URL ?? 'smtp://127.0.0.1:9',
    });
    const { migrate } = await import('../../server/db/migrate');
    const { sequelize } = await import('../../server/models');
    await migrate();
    // The Project Tern build, its episodes and viewer requests (no media: no object store needed).
    const context = { sequelize, queryInterface: sequelize.getQueryInterface() };
    for (const name of [
      '0001-demo-users',
      '0002-project-tern',
      '0003-project-tern-episodes',
      '0005-project-tern-requests',
    ]) {
      const { up } = (await import(`../../server/db/seeders/${name}.ts`)) as {
        up: (a: { context: typeof context }) => Promise<void>;
      };
      await up({ context });
    }
    await sequelize.query(`UPDATE builds SET is_public = TRUE WHERE slug = 'project-tern'`);
    await sequelize.close();

    child = fork(fileURLToPath(import.meta.url), ['--serve'], {
      env: process.env,
      execArgv: ['--import', 'tsx'],
      stdio: ['ignore', 'ignore', 'inherit', 'ipc'],
    });
    await new Promise<number>((resolve, reject) => {
      child!.once('message', (m: { port: number }) => resolve(m.port));
      child!.once('exit', (code) => reject(new Error(`the server exited with ${code}`)));
    });
    serverPid = child.pid;
    const base = `http://127.0.0.1:${port}`;
    const headers = { 'accept-encoding': 'gzip, deflate, br' };
    const targets = [
      { name: 'public build JSON', url: `${base}/api/public/builds/project-tern` },
      { name: '/api/health/live', url: `${base}/api/health/live` },
      { name: 'static index.html', url: `${base}/` },
    ];
    for (const t of targets) {
      const r = await fetch(t.url, { headers });
      if (!r.ok) throw new Error(`${t.name} answered ${r.status}`);
      const size = (await r.arrayBuffer()).byteLength;
      console.log(
        `${t.name}: ${r.status}, ${size} bytes, Content-Encoding ${r.headers.get('content-encoding') ?? 'none'}, Cache-Control ${r.headers.get('cache-control') ?? 'none'}`,
      );
    }
    const run = (await import('autocannon')).default;
    for (const t of targets) await run({ url: t.url, connections: 10, duration: 1, headers });
    const results = await compare(targets, headers);
    const [pub, live, stat] = targets.map((t) => results.get(t.name)!) as [Figures, Figures, Figures];
    console.log(
      `\n${CONNECTIONS} connections, ${SECONDS} s per route (${ROUNDS} alternating rounds), loopback, gzip accepted`,
    );
    console.log(
      `${'route'.padEnd(20)} ${'req/s'.padStart(8)} ${'p50 ms'.padStart(7)} ${'p97.5 ms'.padStart(9)} ${'cpu µs/r'.padStart(9)} ${'failed'.padStart(7)}`,
    );
    for (const t of targets) {
      const f = results.get(t.name)!;
      console.log(
        `${t.name.padEnd(20)} ${f.rps.toFixed(0).padStart(8)} ${f.p50.toFixed(1).padStart(7)} ${f.p95.toFixed(1).padStart(9)} ${f.cpuUs.toFixed(0).padStart(9)} ${String(f.failed).padStart(7)}`,
      );
    }
    // On a busy machine throughput follows the other load; the server's CPU per request does not.
    console.log(
      `by server CPU per request (capacity on an idle core): public ${((stat.cpuUs / pub.cpuUs) * 100).toFixed(1)} %, live ${((stat.cpuUs / live.cpuUs) * 100).toFixed(1)} % of static`,
    );
    const rPublic = pub.rps / stat.rps;
    const rLive = live.rps / stat.rps;
    console.log(`public JSON / static: ${(rPublic * 100).toFixed(1)} % (target ≥ ${TARGET_PUBLIC * 100} %)`);
    console.log(`health/live / static: ${(rLive * 100).toFixed(1)} % (target ≥ ${TARGET_LIVE * 100} %)`);
    const met = rPublic >= TARGET_PUBLIC && rLive >= TARGET_LIVE && pub.failed + live.failed + stat.failed === 0;
    console.log(met ? 'targets met' : 'targets NOT met');
    process.exitCode = met ? 0 : 1;
  } finally {
    if (child && child.exitCode === null) {
      const exited = new Promise((r) => child!.once('exit', r));
      child.kill('SIGTERM');
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
    console.error('[bench:public]', err?.message ?? err);
    process.exitCode = 1;
  });
}
