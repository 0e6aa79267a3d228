// Installs the Debian packages Bayslate needs when they are missing: as root directly,
// otherwise through sudo, with a clear message when neither is possible.
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync, readFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import path from 'node:path';

export const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

export function log(msg) {
  process.stdout.write(`[bayslate] ${msg}\n`);
}

function hasSudo() {
  return spawnSync('sudo', ['-n', 'true'], { stdio: 'ignore' }).status === 0;
}

/** Finds the newest installed PostgreSQL server's bin folder, or null. */
export function findPostgresBin() {
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return null;
  const versions = readdirSync(base)
    .filter((v) => existsSync(path.join(base, v, 'bin', 'initdb')))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? path.join(base, versions[0], 'bin') : null;
}

export function findChromium() {
  for (const p of ['/usr/lib/chromium/chromium', '/usr/bin/chromium']) if (existsSync(p)) return p;
  return null;
}

let aptUpdated = false;
/** Installs the given Debian packages (names) if `present()` says they are missing. */
export function ensureDebianPackages(packages, present, why) {
  if (present()) return;
  log(`installing Debian packages for ${why}: ${packages.join(' ')} (one time)`);
  const run = (args) => {
    const cmd = isRoot ? args[0] : 'sudo';
    const argv = isRoot ? args.slice(1) : ['-n', ...args];
    execFileSync(cmd, argv, {
      stdio: ['ignore', 'inherit', 'inherit'],
      env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
    });
  };
  if (!isRoot && !hasSudo()) {
    throw new Error(
      `Bayslate needs the Debian packages ${packages.join(', ')} for ${why}, and this user can neither ` +
        `install them (not root) nor use sudo without a password. Ask an administrator to run:\n` +
        `  sudo apt-get install -y ${packages.join(' ')}`,
    );
  }
  if (!aptUpdated) {
    run(['apt-get', 'update', '-qq']);
    aptUpdated = true;
  }
  // With recommended packages, as checked on these machines (Chromium brings its fonts that way).
  run(['apt-get', 'install', '-y', '-qq', ...packages]);
  if (!present()) throw new Error(`installed ${packages.join(' ')} but still cannot find it`);
}

export function ensurePostgres() {
  ensureDebianPackages(['postgresql'], () => findPostgresBin() !== null, 'the database');
  return findPostgresBin();
}

export function ensureChromium() {
  ensureDebianPackages(['chromium'], () => findChromium() !== null, 'the browser tests');
  return findChromium();
}

/** Runs `npm ci` when node_modules is missing or older than the lock file. */
export function ensureNodeModules(root) {
  const lock = path.join(root, 'package-lock.json');
  const stamp = path.join(root, 'node_modules', '.package-lock.json');
  const hashFile = path.join(root, 'node_modules', '.bayslate-lock-hash');
  const lockHash = createHash('sha256').update(readFileSync(lock)).digest('hex');
  let fresh = existsSync(stamp) && existsSync(hashFile) && readFileSync(hashFile, 'utf8') === lockHash;
  if (!fresh && existsSync(stamp) && !existsSync(hashFile)) {
    // Installed by hand (npm install): trust it when it is newer than the lock file.
    fresh = statSync(stamp).mtimeMs >= statSync(lock).mtimeMs;
  }
  if (fresh) return;
  log('installing npm packages (npm ci)…');
  execFileSync('npm', ['ci', '--no-audit', '--no-fund'], { cwd: root, stdio: 'inherit' });
  execFileSync('node', ['-e', `require('fs').writeFileSync(${JSON.stringify(hashFile)}, ${JSON.stringify(lockHash)})`]);
}
