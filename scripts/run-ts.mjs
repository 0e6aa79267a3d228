// Runs a TypeScript script against the local cluster (started if needed), for npm run helpers.
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { devEnvironment } from './lib/dev-env.mjs';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const { env } = await devEnvironment(root);
const r = spawnSync(process.execPath, ['--import', 'tsx', ...process.argv.slice(2)], {
  cwd: root,
  env,
  stdio: 'inherit',
});
process.exit(r.status ?? 1);
