// `npm start`: everything up with demo data — Debian packages, npm packages, the client build,
// the private PostgreSQL cluster, the local fake S3 and SMTP (each in a process of its own,
// restarted if it stops), the server (which migrates and seeds once). Ctrl-C stops all of it.
// `npm run dev` adds Vite's hot reload.
import { spawn, execFileSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensureNodeModules, ensurePostgres, log } from './lib/system.mjs';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const dev = process.argv.includes('--dev');

function newestMtime(dir) {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, entry.name);
    newest = Math.max(newest, entry.isDirectory() ? newestMtime(p) : statSync(p).mtimeMs);
  }
  return newest;
}

function clientIsStale() {
  const built = path.join(root, 'dist', 'index.html');
  if (!existsSync(built)) return true;
  const sources = Math.max(
    newestMtime(path.join(root, 'src')),
    newestMtime(path.join(root, 'shared')),
    statSync(path.join(root, 'index.html')).mtimeMs,
  );
  return sources > statSync(built).mtimeMs;
}

const t0 = Date.now();
try {
  if (!process.env.DATABASE_URL) ensurePostgres();
  ensureNodeModules(root);
  if (!dev && clientIsStale()) {
    log('building the client…');
    execFileSync(process.execPath, [path.join(root, 'node_modules/vite/bin/vite.js'), 'build', '--logLevel', 'warn'], {
      cwd: root,
      stdio: 'inherit',
    });
  }
} catch (err) {
  console.error(`[bayslate] ${err.message}`);
  process.exit(1);
}

const { devEnvironment } = await import('./lib/dev-env.mjs');
let cluster = null;
let env;
try {
  ({ env, cluster } = await devEnvironment(root));
} catch (err) {
  console.error(`[bayslate] ${err.message}`);
  process.exit(1);
}
env.PORT ??= '3000';
env.BAYSLATE_DEMO ??= '1';
const children = [];
const fakes = [];
try {
  const { keepFakeRunning } = await import('./lib/local-fakes.mjs');
  if (!env.S3_ENDPOINT) {
    const s3 = await keepFakeRunning(root, 's3', env, Number(env.LOCAL_S3_PORT ?? 0));
    fakes.push(s3);
    env.S3_ENDPOINT = `http://127.0.0.1:${s3.port}`;
    log(`local fake S3 on ${env.S3_ENDPOINT} (files in ${env.LOCAL_S3_DIR})`);
  }
  if (!env.SMTP_URL) {
    const smtp = await keepFakeRunning(root, 'smtp', env, Number(env.LOCAL_SMTP_PORT ?? 0));
    fakes.push(smtp);
    env.SMTP_URL = `smtp://127.0.0.1:${smtp.port}`;
    log(`local fake SMTP on 127.0.0.1:${smtp.port} (mails in ${env.LOCAL_MAIL_DIR})`);
  }
} catch (err) {
  console.error(`[bayslate] ${err.message}`);
  for (const f of fakes) await f.stop();
  if (cluster) cluster.stop();
  process.exit(1);
}
const server = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
  cwd: root,
  env,
  stdio: ['ignore', 'pipe', 'inherit'],
});
children.push(server);
server.stdout.on('data', (chunk) => {
  process.stdout.write(chunk);
  if (String(chunk).includes('server listening')) {
    const url = dev ? 'http://127.0.0.1:5173' : `http://127.0.0.1:${env.PORT}`;
    log(`ready in ${((Date.now() - t0) / 1000).toFixed(1)} s`);
    log(`open ${url}`);
    if (env.BAYSLATE_DEMO !== '0') {
      log(
        'demo sign-ins (password bayslate-demo): owner@cedar-ridge.test, producer@cedar-ridge.test, installer@cedar-ridge.test, marketing@cedar-ridge.test',
      );
      log(`public build page: ${url}/b/project-tern    development inbox: http://127.0.0.1:${env.PORT}/dev/mail`);
    }
    log('press Ctrl-C to stop');
  }
});
if (dev) {
  const vite = spawn(process.execPath, [path.join(root, 'node_modules/vite/bin/vite.js')], {
    cwd: root,
    env: { ...env, BAYSLATE_API_PORT: env.PORT },
    stdio: 'inherit',
  });
  children.push(vite);
}

let stopping = false;
function stopAll(code = 0) {
  if (stopping) return;
  stopping = true;
  log('stopping…');
  for (const c of children) if (c.exitCode === null) c.kill('SIGTERM');
  const done = async () => {
    await Promise.all(fakes.map((f) => f.stop()));
    if (cluster) cluster.stop();
    process.exit(code);
  };
  const wait = children.filter((c) => c.exitCode === null).map((c) => new Promise((r) => c.once('exit', r)));
  Promise.race([Promise.all(wait), new Promise((r) => setTimeout(r, 8000))]).then(done);
}
process.on('SIGINT', () => stopAll(0));
process.on('SIGTERM', () => stopAll(0));
server.on('exit', (code) => {
  if (!stopping) {
    console.error(`[bayslate] the server stopped (exit ${code})`);
    stopAll(code ?? 1);
  }
});
