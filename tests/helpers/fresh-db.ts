// A database of a browser test's own: each journey clones the migrated, demo-seeded template into
// a new database and starts the app server on it, so a journey never sees rows another journey (or
// an earlier run of itself) wrote. Builds on the harness of tests/helpers/browser.ts.
import { inject, beforeEach, afterEach } from 'vitest';
import pg from 'pg';
import { randomBytes } from 'node:crypto';
import { startAppServer, type AppServer } from './browser';

function adminUrl(): string {
  const u = new URL(inject('pgTemplateUrl'));
  u.pathname = '/postgres';
  return u.toString();
}

async function asAdmin<T>(fn: (c: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: adminUrl() });
  await client.connect();
  try {
    return await fn(client);
  } finally {
    await client.end();
  }
}

export interface FreshDatabase {
  /** Connection string of the new database. */
  url: string;
  /** Runs SQL on this database (parameters as $1, $2 …); returns the rows. */
  sql: <R extends Record<string, unknown> = Record<string, unknown>>(text: string, params?: unknown[]) => Promise<R[]>;
  /** Drops the database (closes this helper's connection first). */
  drop: () => Promise<void>;
}

/** Clones the template database into a new, uniquely named database. */
export async function freshDatabase(): Promise<FreshDatabase> {
  const name = `e2e_${process.pid}_${randomBytes(5).toString('hex')}`;
  await asAdmin((c) => c.query(`CREATE DATABASE ${name} TEMPLATE bayslate_template`));
  const u = new URL(inject('pgTemplateUrl'));
  u.pathname = `/${name}`;
  const url = u.toString();
  const pool = new pg.Pool({ connectionString: url, max: 2 });
  // An idle connection ended by the server must not crash the test process.
  pool.on('error', () => undefined);
  return {
    url,
    sql: async (text, params = []) => (await pool.query(text, params)).rows,
    drop: async () => {
      await pool.end();
      await asAdmin((c) => c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`));
    },
  };
}

export interface FreshApp {
  server: AppServer;
  db: FreshDatabase;
  /** Stops the server and drops its database. */
  stop: () => Promise<void>;
}

/**
 * A fresh database and the app server (built client included) running on it. Call it at the start
 * of each browser test and `stop()` it in the test's `finally`.
 */
export async function freshApp(env: Record<string, string> = {}): Promise<FreshApp> {
  const db = await freshDatabase();
  let server: AppServer;
  try {
    server = await startAppServer({ DATABASE_URL: db.url, ...env });
  } catch (err) {
    await db.drop();
    throw err;
  }
  return {
    server,
    db,
    stop: async () => {
      await server.stop();
      await db.drop();
    },
  };
}

/**
 * Gives every test of the file calling it a fresh app (database and server): started before each
 * test, stopped and dropped after it. Returns the current test's app.
 */
export function freshAppPerTest(env: Record<string, string> = {}): () => FreshApp {
  let app: FreshApp | undefined;
  beforeEach(async () => {
    app = await freshApp(env);
  });
  afterEach(async () => {
    await app?.stop();
    app = undefined;
  });
  return () => {
    if (!app) throw new Error('freshAppPerTest: no app outside a test');
    return app;
  };
}

/** Id of the demo build Project Tern in this database. */
export async function ternId(db: FreshDatabase): Promise<number> {
  const [row] = await db.sql<{ id: number }>(`SELECT id FROM builds WHERE slug = 'project-tern'`);
  if (!row) throw new Error('the demo build Project Tern is missing from the template');
  return row.id;
}
