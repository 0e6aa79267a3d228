// The environment of a local run: the private cluster's URL (unless DATABASE_URL is set)
// and a session secret kept under .data so sign-ins survive a restart.
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import { startCluster } from './pg-cluster.mjs';

export async function devEnvironment(root, { startDb = true } = {}) {
  const data = path.join(root, '.data');
  mkdirSync(data, { recursive: true });
  const env = { ...process.env };
  if (!env.SESSION_SECRET) {
    const f = path.join(data, 'session-secret');
    if (!existsSync(f)) writeFileSync(f, randomBytes(32).toString('hex'), { mode: 0o600 });
    env.SESSION_SECRET = readFileSync(f, 'utf8').trim();
  }
  if (!env.VIEWER_KEY_SECRET) {
    // The key of viewers' address hashes and unsubscribe links, kept like the session secret.
    const f = path.join(data, 'viewer-key-secret');
    if (!existsSync(f)) writeFileSync(f, randomBytes(32).toString('hex'), { mode: 0o600 });
    env.VIEWER_KEY_SECRET = readFileSync(f, 'utf8').trim();
  }
  let cluster = null;
  if (!env.DATABASE_URL && startDb) {
    // Reuses a cluster that is already running (e.g. under npm start).
    cluster = await startCluster({ home: path.join(data, 'pg'), port: Number(env.BAYSLATE_PG_PORT ?? 54329) });
    env.DATABASE_URL = cluster.url;
  }
  env.LOCAL_S3_DIR ??= path.join(data, 's3');
  env.LOCAL_MAIL_DIR ??= path.join(data, 'mail');
  env.UPLOAD_DIR ??= path.join(data, 'uploads');
  return { env, cluster };
}
