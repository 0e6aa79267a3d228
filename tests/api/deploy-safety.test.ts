// What was seen (1): demo mode was the server's default. With NODE_ENV=production and
// BAYSLATE_DEMO unset on a fresh database the demo owner signed in, /api/health/demo gave the
// password and /dev/mail was open; with BAYSLATE_DEMO=0 the demo owner could still sign in.
// These run the compiled server (npm run build) as npm run serve does.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import pg from 'pg';
import { randomBytes } from 'node:crypto';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { isBuiltin } from 'node:module';
import { buildServer, Client, removeBuild, runServerToEnd, startServerProcess } from '../helpers/server-process';
import { DEMO_PASSWORD, DEMO_USERS } from '../../server/db/seeders/0001-demo-users';
import { DEMO_EMAILS } from '../../server/db/demoAccounts';
import { errorHandler } from '../../server/middleware/errors';

const admin = new URL(inject('pgTemplateUrl'));
admin.pathname = '/postgres';
const freshName = `fresh_${process.pid}_${randomBytes(3).toString('hex')}`;
const freshUrl = new URL(inject('pgTemplateUrl'));
freshUrl.pathname = `/${freshName}`;

async function adminQuery(sql: string) {
  const c = new pg.Client({ connectionString: admin.toString() });
  await c.connect();
  try {
    await c.query(sql);
  } finally {
    await c.end();
  }
}

beforeAll(async () => {
  buildServer();
  await adminQuery(`CREATE DATABASE ${freshName}`);
});
afterAll(async () => {
  removeBuild();
  await adminQuery(`DROP DATABASE IF EXISTS ${freshName} WITH (FORCE)`);
});

// A production start needs its own viewer-key secret (32+ characters), like every real deployment.
const production = {
  NODE_ENV: 'production',
  BAYSLATE_DEMO: undefined,
  PASSWORD_HASH_COST: undefined,
  MAIL_WORKER: '0',
  VIEWER_KEY_SECRET: 'deploy-test-viewer-key-secret-0123456789abcdef',
};

describe('the compiled production start on a fresh database', () => {
  it('has no demo sign-in, no /api/health/demo and no /dev/mail', async () => {
    const s = await startServerProcess({ ...production, DATABASE_URL: freshUrl.toString() });
    try {
      const c = new Client(s.url);
      for (const email of DEMO_EMAILS)
        expect((await c.post('/api/auth/login', { email, password: DEMO_PASSWORD })).status).toBe(401);
      expect((await c.get('/api/health/demo')).status).toBe(404);
      expect((await c.get('/dev/mail')).status).toBe(404);
      expect((await c.get('/api/health/live')).body).toEqual({ ok: true });
      // The migrations ran from the compiled files, recorded under their source names.
      const db = new pg.Client({ connectionString: freshUrl.toString() });
      await db.connect();
      const names = (await db.query('SELECT name FROM schema_migrations ORDER BY name')).rows.map((r) => r.name);
      const users = (await db.query('SELECT count(*)::int AS n FROM users')).rows[0].n;
      await db.end();
      expect(names[0]).toBe('0001-users-and-sessions.ts');
      expect(names).toContain('0010-shared-state.ts');
      expect(users).toBe(0);
    } finally {
      await s.stop();
    }
  });

  // Each start only reads its settings and refuses: they run side by side.
  it.concurrent('refuses to start with BAYSLATE_DEMO on, naming the fix', async () => {
    const r = await runServerToEnd({ ...production, BAYSLATE_DEMO: '1', DATABASE_URL: freshUrl.toString() });
    expect(r.code).toBe(1);
    expect(r.output).toMatch(/refuses to start: BAYSLATE_DEMO is on.*set BAYSLATE_DEMO=0/s);
  });

  it.concurrent('refuses to start on a database that holds demo accounts, naming them and the fix', async () => {
    // This file's own database was seeded with the demo build.
    const r = await runServerToEnd({ ...production });
    expect(r.code).toBe(1);
    expect(r.output).toContain('owner@cedar-ridge.test');
    expect(r.output).toMatch(/fresh database, or deactivate them: UPDATE users SET active = false/);
  });

  it.concurrent('refuses to start without object storage or mail settings, saying npm start fakes them', async () => {
    const r = await runServerToEnd({ ...production, DATABASE_URL: freshUrl.toString(), S3_ENDPOINT: undefined });
    expect(r.code).toBe(1);
    expect(r.output).toMatch(/S3_ENDPOINT is not set.*npm start/s);
  });

  it('contains no development-only package, tsx or seeder in its start-up imports', () => {
    const code = readFileSync(path.join(buildServer(), 'index.js'), 'utf8');
    for (const name of ['tsx', 's3rver', 'smtp-server', 'mailparser'])
      expect(code).not.toMatch(new RegExp(`^import[^;]*from\\s*["']${name}["']`, 'm'));
    // The seeders' data stays out (the demo route's password literal is answered in demo mode only).
    expect(code).not.toMatch(/Project Tern|Cedar Ridge Upfitters|seeders\//);
  });

  it('runs with production dependencies only (npm ci --omit=dev): mailparser only as a demo-mode dynamic import', () => {
    const pkg = JSON.parse(readFileSync(path.resolve(import.meta.dirname, '../../package.json'), 'utf8'));
    const code = readFileSync(path.join(buildServer(), 'index.js'), 'utf8');
    const statics = [...code.matchAll(/^import[^;]*?from\s*["']([^"'.][^"']*)["']/gm)].map((m) => m[1]);
    const dynamics = [...code.matchAll(/import\(\s*["']([^"'.][^"']*)["']\s*\)/g)].map((m) => m[1]);
    const pkgName = (n: string) => (n.startsWith('@') ? n.split('/').slice(0, 2).join('/') : n.split('/')[0]);
    const outside = [...statics, ...dynamics]
      .map(pkgName)
      .filter((n) => !n.startsWith('node:') && !isBuiltin(n) && !pkg.dependencies[n]);
    expect([...new Set(outside)]).toEqual(['mailparser']);
    expect(statics.map(pkgName)).not.toContain('mailparser');
  });
});

describe('demo mode off outside production', () => {
  it('with BAYSLATE_DEMO=0 a seeded database keeps its demo accounts, but none signs in', async () => {
    const s = await startServerProcess({ NODE_ENV: 'test', BAYSLATE_DEMO: '0', MAIL_WORKER: '0' });
    try {
      const c = new Client(s.url);
      expect((await c.post('/api/auth/login', { email: DEMO_EMAILS[0], password: DEMO_PASSWORD })).status).toBe(401);
      expect((await c.get('/api/health/demo')).status).toBe(404);
      expect((await c.get('/dev/mail')).status).toBe(404);
    } finally {
      await s.stop();
    }
  });

  it('the server-side list of demo e-mails matches the demo seeder', () => {
    expect([...DEMO_EMAILS]).toEqual(DEMO_USERS.map((u) => u.email));
  });
});

describe('error answers', () => {
  it('an unexpected error answers 500 without its internal message outside development', () => {
    let status = 0;
    let body: unknown = null;
    const res = {
      headersSent: false,
      status: (s: number) => ((status = s), res),
      json: (b: unknown) => ((body = b), res),
    };
    errorHandler(
      new Error('relation "secret_table" does not exist'),
      { method: 'GET', originalUrl: '/x' } as never,
      res as never,
      () => undefined,
    );
    expect(status).toBe(500);
    expect(JSON.stringify(body)).not.toContain('secret_table');
  });

  it('a database that cannot be reached answers 503 with a clear message', () => {
    let status = 0;
    let body: { error?: { message?: string } } = {};
    const res = {
      headersSent: false,
      status: (s: number) => ((status = s), res),
      json: (b: typeof body) => ((body = b), res),
    };
    errorHandler(
      Object.assign(new Error('terminating connection due to administrator command'), { code: '57P01' }),
      { method: 'GET', originalUrl: '/x' } as never,
      res as never,
      () => undefined,
    );
    expect(status).toBe(503);
    expect(body.error?.message).toMatch(/database is not reachable/);
  });
});
