// Vitest global setup for API and browser tests: a throwaway PostgreSQL cluster with a
// migrated, demo-seeded template database that each test file clones, plus the local fake
// S3 and SMTP servers. Everything is torn down at the end, passing or failing.
import { spawn } from 'node:child_process';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { startThrowawayCluster } from '../../scripts/lib/pg-cluster.mjs';
import { startTestFakes } from './fakes';

declare module 'vitest' {
  export interface ProvidedContext {
    pgTemplateUrl: string;
    s3Endpoint: string;
    smtpPort: number;
    mailDir: string;
  }
}

const root = path.resolve(import.meta.dirname, '../..');

function runNode(
  args: string[],
  env: NodeJS.ProcessEnv,
): Promise<{ status: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, args, { cwd: root, env, stdio: ['ignore', 'pipe', 'pipe'] });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (c) => (stdout += c));
    child.stderr.on('data', (c) => (stderr += c));
    child.on('close', (status) => resolve({ status, stdout, stderr }));
  });
}

interface Services {
  url: string;
  s3Endpoint: string;
  smtpPort: number;
  mailDir: string;
  stop: () => Promise<void>;
}

async function startServices(): Promise<Services> {
  const cluster = await startThrowawayCluster();
  const fakes = await startTestFakes();
  const env = {
    ...process.env,
    NODE_ENV: 'test',
    DATABASE_URL: cluster.url,
    SESSION_SECRET: 'test-secret-test-secret-test-secret',
    BAYSLATE_DEMO: '1',
    // bcrypt at its lowest cost: hundreds of sign-ins, each a tenth of a second of CPU at the default.
    PASSWORD_HASH_COST: '4',
    S3_ENDPOINT: fakes.s3Endpoint,
    SMTP_URL: `smtp://127.0.0.1:${fakes.smtpPort}`,
  };
  // Not spawnSync: the fake S3 runs in this process and must answer the demo media seeder.
  const r = await runNode(['--import', 'tsx', 'scripts/db-setup.ts'], env);
  if (r.status !== 0) {
    cluster.stop();
    await fakes.stop();
    throw new Error(`preparing the template database failed:\n${r.stdout}\n${r.stderr}`);
  }
  return {
    url: cluster.url,
    s3Endpoint: fakes.s3Endpoint,
    smtpPort: fakes.smtpPort,
    mailDir: fakes.mailDir,
    stop: async () => {
      await fakes.stop();
      cluster.stop();
    },
  };
}

// The API and browser projects share one cluster, template and pair of fakes per run (Vitest runs
// every project's global setup in this one process): made by the first project that asks, torn
// down when the last one is done. Files still never share rows: each clones the template.
const SHARED = Symbol.for('bayslate.testServices');
type Shared = { users: number; ready: Promise<Services> };
const holder = globalThis as typeof globalThis & { [SHARED]?: Shared };

export default async function setup(project: TestProject) {
  const shared = (holder[SHARED] ??= { users: 0, ready: startServices() });
  shared.users += 1;
  let s: Services;
  try {
    s = await shared.ready;
  } catch (err) {
    if (--shared.users === 0 && holder[SHARED] === shared) delete holder[SHARED];
    throw err;
  }
  project.provide('pgTemplateUrl', s.url);
  project.provide('s3Endpoint', s.s3Endpoint);
  project.provide('smtpPort', s.smtpPort);
  project.provide('mailDir', s.mailDir);
  return async () => {
    if (--shared.users > 0) return;
    if (holder[SHARED] === shared) delete holder[SHARED];
    await s.stop();
  };
}
