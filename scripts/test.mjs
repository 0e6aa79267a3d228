// `npm test`: every test on a fresh machine. Installs what is missing (PostgreSQL, Chromium,
// npm packages), builds the client, then runs the unit, API and browser projects. Each API or
// browser run starts its own throwaway cluster and fakes and tears them down, pass or fail.
import { execFileSync, spawnSync } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensureChromium, ensureNodeModules, ensurePostgres, log } from './lib/system.mjs';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const t0 = Date.now();
try {
  ensurePostgres();
  ensureChromium();
  ensureNodeModules(root);
  log('linting (correctness and layer boundaries, eslint.config.js)…');
  execFileSync(process.execPath, [path.join(root, 'node_modules/eslint/bin/eslint.js'), '.'], { cwd: root, stdio: 'inherit' });
  log('type-checking shared (no DOM, no Node), client (DOM), server (Node) and tests…');
  execFileSync(process.execPath, [path.join(root, 'scripts/typecheck-layers.mjs')], { cwd: root, stdio: 'inherit' });
  log('building the client for the browser tests…');
  execFileSync(process.execPath, [path.join(root, 'node_modules/vite/bin/vite.js'), 'build', '--logLevel', 'warn'], { cwd: root, stdio: 'inherit' });
} catch (err) {
  console.error(`[bayslate] ${err.message.split('\n')[0]}`);
  process.exit(1);
}
const extra = process.argv.slice(2);
const r = spawnSync(process.execPath, [path.join(root, 'node_modules/vitest/vitest.mjs'), 'run', ...extra], {
  cwd: root,
  stdio: 'inherit',
  env: { ...process.env, NODE_ENV: 'test' },
});
log(`tests finished in ${((Date.now() - t0) / 1000).toFixed(0)} s`);
process.exit(r.status ?? 1);
