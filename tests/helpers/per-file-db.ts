// Runs before each API or browser test file: clones the template database into a database of
// the file's own, and points the server's configuration at it. Files never share rows.
import { inject, vi } from 'vitest';
import pg from 'pg';
import { randomBytes } from 'node:crypto';

// A worker runs several files one after another (isolate: false saves loading the packages again for
// each file): every file starts from the environment the worker started with and from freshly
// evaluated modules of our own, so the server's configuration is read again for this file's database.
const g = globalThis as { __bayslateEnv?: NodeJS.ProcessEnv };
g.__bayslateEnv ??= { ...process.env };
for (const k of Object.keys(process.env)) if (!(k in g.__bayslateEnv)) delete process.env[k];
Object.assign(process.env, g.__bayslateEnv);
vi.resetModules();

const templateUrl = inject('pgTemplateUrl');
const name = `t_${process.pid}_${randomBytes(4).toString('hex')}`;
const admin = new URL(templateUrl);
admin.pathname = '/postgres';
const client = new pg.Client({ connectionString: admin.toString() });
await client.connect();
try {
  await client.query(`CREATE DATABASE ${name} TEMPLATE bayslate_template`);
} finally {
  await client.end();
}
const url = new URL(templateUrl);
url.pathname = `/${name}`;

Object.assign(process.env, {
  NODE_ENV: 'test',
  DATABASE_URL: url.toString(),
  SESSION_SECRET: 'test-secret-test-secret-test-secret',
  BAYSLATE_DEMO: '1',
  // bcrypt at its lowest cost: hundreds of sign-ins, each a tenth of a second of CPU at the default.
  PASSWORD_HASH_COST: '4',
  SERVE_CLIENT: '0',
  MAIL_WORKER: '0',
  S3_ENDPOINT: inject('s3Endpoint'),
  SMTP_URL: `smtp://127.0.0.1:${inject('smtpPort')}`,
  LOCAL_MAIL_DIR: inject('mailDir'),
});
