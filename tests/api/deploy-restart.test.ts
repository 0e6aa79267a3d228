// What was seen (2): a PostgreSQL restart killed the server — the session store's pool had no
// 'error' listener, so an idle connection ended by `pg_ctl -m fast stop` (57P01) crashed the
// process, and it stayed down. Here the compiled server runs against a cluster of this file's own,
// which the test stops and starts while the signed-in session's connections sit idle in the pools.
// Also: /api/health/live and /ready, and the graceful stop on SIGTERM.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import pg from 'pg';
import { startThrowawayCluster, type Cluster } from '../../scripts/lib/pg-cluster.mjs';
import {
  buildServer,
  Client,
  removeBuild,
  runServerToEnd,
  startServerProcess,
  type ServerProcess,
} from '../helpers/server-process';

const OWNER = { email: 'restart-owner@shop.test', password: 'restart-pass-1234' };
let cluster: Cluster;
let server: ServerProcess;

beforeAll(async () => {
  buildServer();
  cluster = await startThrowawayCluster();
  // Migrates the empty cluster and makes an owner, as an operator does (build/server/create-owner.js).
  const made = await runServerToEnd({ NODE_ENV: 'test', DATABASE_URL: cluster.url }, 'create-owner.js', [
    OWNER.email,
    'Restart Owner',
    OWNER.password,
  ]);
  if (made.code !== 0) throw new Error(made.output);
  server = await startServerProcess({
    NODE_ENV: 'test',
    DATABASE_URL: cluster.url,
    BAYSLATE_DEMO: '0',
    MAIL_WORKER: '1',
    MAIL_POLL_MS: '200',
    SHUTDOWN_GRACE_MS: '5000',
    LOG_TEST_ERRORS: '1',
  });
});

afterAll(async () => {
  await server?.stop('SIGKILL');
  cluster?.stop();
  removeBuild();
});

describe('PostgreSQL restarts under a running server', () => {
  it('answers 503 while the database is stopped and recovers, with the same session, once it is back', async () => {
    const owner = new Client(server.url);
    const login = await owner.post('/api/auth/login', OWNER);
    expect(login.status, server.output()).toBe(200);
    expect((await owner.get('/api/auth/me')).status).toBe(200);
    const up = await owner.get('/api/health/ready');
    expect(up.status, up.text + server.output()).toBe(200);

    cluster.pause();
    // The pools' idle connections have just been ended by the server (57P01); wait out the ready
    // check's one-second reuse too.
    await new Promise((r) => setTimeout(r, 1100));
    const down = await owner.get('/api/auth/me');
    expect(down.status).toBe(503);
    expect(down.body.error).toMatchObject({ code: 'unavailable' });
    expect(down.body.error.message).toMatch(/database is not reachable right now/);
    expect((await owner.get('/api/health/live')).status).toBe(200);
    const ready = await owner.get('/api/health/ready');
    expect(ready.status).toBe(503);
    expect(ready.body).toMatchObject({ ok: false, db: false });
    expect(server.child.exitCode).toBeNull();

    cluster.resume();
    const back = await owner.get('/api/auth/me');
    expect(back.status, back.text + server.output()).toBe(200);
    expect(back.body.user.email).toBe(OWNER.email);
    expect(server.output()).not.toMatch(/Unhandled 'error' event/);
  });

  it('the ready check reuses its result for about a second', async () => {
    const c = new Client(server.url);
    await new Promise((r) => setTimeout(r, 1100));
    const first = await c.get('/api/health/ready');
    const second = await c.get('/api/health/ready');
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ ok: true, db: true, storage: true, mail: true });
    // The same checks' result (same time stamp), not a second round of remote checks.
    expect(second.body.checkedAt).toBe(first.body.checkedAt);
    await new Promise((r) => setTimeout(r, 1100));
    expect((await c.get('/api/health/ready')).body.checkedAt).not.toBe(first.body.checkedAt);
  });
});

describe('graceful stop on SIGTERM', () => {
  it('finishes the request in flight, takes no new one, closes the pools and exits 0', async () => {
    const owner = new Client(server.url);
    expect((await owner.post('/api/auth/login', OWNER)).status).toBe(200);
    // Hold this session's row so sign-out waits on the database: a request in flight.
    const db = new pg.Client({ connectionString: cluster.url });
    await db.connect();
    await db.query('BEGIN');
    await db.query('SELECT * FROM session FOR UPDATE');
    const inFlight = owner.post('/api/auth/logout', {});
    await new Promise((r) => setTimeout(r, 300));
    server.child.kill('SIGTERM');
    await new Promise((r) => setTimeout(r, 300));
    // Still running (the request is in flight), but new connections are refused.
    expect(server.child.exitCode).toBeNull();
    await expect(fetch(`${server.url}/api/health/live`)).rejects.toThrow();
    await db.query('COMMIT');
    await db.end();
    expect((await inFlight).status).toBe(200);
    expect(await server.exited).toBe(0);
    expect(server.output()).toMatch(/SIGTERM: stopping/);
    expect(server.output()).toMatch(/\[bayslate\] stopped/);
  });
});
