// What was seen: with one worker running many API files (isolate: false), each file's database kept
// two or three connections open after the file ended — the listening connections and the shared
// pool, which the end of a file did not close — until PostgreSQL refused new connections
// (too_many_connections) and a later file's requests answered 503. closeDatabaseConnections() ends
// every connection a server process holds, as the graceful stop does and each API file's end does.
import { describe, it, expect } from 'vitest';
import pg from 'pg';
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
