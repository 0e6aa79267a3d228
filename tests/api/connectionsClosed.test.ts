// What was seen: with one worker running many API files (isolate: false), each file's database kept
// two or three connections open after the file ended — the listening connections and the shared
// pool, which the end of a file did not close — until PostgreSQL refused new connections
// (too_many_connections) and a later file's requests answered 503. closeDatabaseConnections() ends
// every connection a server process holds, as the graceful stop does and each API file's end does.
//
// Also seen (a busy fresh-clone run): the graceful stop exited 0 without its last line, "[bayslate]
// stopped". The listening connections are unref'd; once the pools had gone, nothing kept the
// process alive while they ended, and it left before the stop's last step. A process of its own
// (tests/helpers/close-connections-child.ts) shows it every time: its connections go through a
// proxy here that passes PostgreSQL's end of a connection on half a second late.
import { describe, it, expect } from 'vitest';
import pg from 'pg';
import net from 'node:net';
import path from 'node:path';
import { spawn } from 'node:child_process';
import { signInAs } from '../helpers/api';
import { config } from '../../server/config';
import { Build } from '../../server/models';
import { subscribe } from '../../server/services/buildEvents';
import { closeDatabaseConnections } from '../../server/db/connections';

/** Connections to this file's database other than the checker's own. */
async function openConnections(): Promise<number> {
  const c = new pg.Client({ connectionString: config().DATABASE_URL });
  await c.connect();
  try {
    const dbName = new URL(config().DATABASE_URL).pathname.slice(1);
    const r = await c.query<{ n: number }>(
      'SELECT count(*)::int AS n FROM pg_stat_activity WHERE datname = $1 AND pid <> pg_backend_pid()',
      [dbName],
    );
    return r.rows[0].n;
  } finally {
    await c.end();
  }
}

describe('closing a server process’s database connections', () => {
  it('ends the pools and every listening connection', async () => {
    const owner = await signInAs('owner'); // the shared pool (sessions) and the model layer's pool
    const tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!;
    expect((await owner.get(`/api/builds/${tern.id}/overview`)).status).toBe(200); // the overview cache listens
    const unsubscribe = await subscribe(tern.id, () => undefined); // live build events listen
    expect(await openConnections()).toBeGreaterThanOrEqual(4);

    unsubscribe();
    await closeDatabaseConnections();
    // A backend leaves pg_stat_activity a moment after its client has gone: wait for that, up to 10 s.
    let left = await openConnections();
    for (const until = Date.now() + 10_000; left > 0 && Date.now() < until; left = await openConnections())
      await new Promise((r) => setTimeout(r, 100));
    expect(left).toBe(0);
  });
});

/** A TCP proxy to PostgreSQL that passes the server's end of each connection on `holdMs` late. */
async function lateEndingProxy(target: URL, holdMs: number) {
  const sockets = new Set<net.Socket>();
  const server = net.createServer((down) => {
    const up = net.connect(Number(target.port), target.hostname);
    for (const s of [down, up]) {
      sockets.add(s);
      s.on('error', () => undefined);
    }
    down.pipe(up);
    up.on('data', (d) => down.write(d));
    up.on('end', () => setTimeout(() => down.end(), holdMs));
    down.on('close', () => up.destroy());
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const url = new URL(target);
  url.hostname = '127.0.0.1';
  url.port = String((server.address() as net.AddressInfo).port);
  return {
    url: url.toString(),
    close: () => {
      sockets.forEach((s) => s.destroy());
      server.close();
    },
  };
}

describe('the last step of a stop', () => {
  it('keeps the process alive until every listening connection has ended', async () => {
    const proxy = await lateEndingProxy(new URL(config().DATABASE_URL), 500);
    try {
      const child = spawn(
        process.execPath,
        ['--import', 'tsx', path.resolve(import.meta.dirname, '../helpers/close-connections-child.ts')],
        { env: { ...process.env, DATABASE_URL: proxy.url }, stdio: ['ignore', 'pipe', 'pipe'] },
      );
      let output = '';
      child.stdout.on('data', (c) => (output += c));
      child.stderr.on('data', (c) => (output += c));
      const timer = setTimeout(() => child.kill('SIGKILL'), 60_000);
      const code = await new Promise<number | null>((resolve) => child.once('close', resolve));
      clearTimeout(timer);
      expect(output).toMatch(/listening: true; pool sockets left: 0/);
      // Before: the process had already exited here (code 13, its top-level await left unsettled).
      expect(output).toContain('all connections closed');
      expect(code, output).toBe(0);
    } finally {
      proxy.close();
    }
  });
});
