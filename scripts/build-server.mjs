// `npm run build` (second half): compiles the server to JavaScript in build/server with esbuild.
//   build/server/index.js          the server (npm run serve runs it with NODE_ENV=production)
//   build/server/create-owner.js   makes the first owner on a production database
//   build/server/migrations/*.js   the schema migrations (db/migrate.ts finds them beside index.js)
// Our own code is bundled; packages stay imports of node_modules. The demo seeders, the local
// fakes (s3rver, smtp-server, mailparser) and tsx are not part of it: the script fails if any of
// them is imported at start-up.
import { build } from 'esbuild';
import { readdirSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const outArg = process.argv.indexOf('--out');
const out = path.resolve(root, outArg > 0 ? process.argv[outArg + 1] : 'build/server');
const t0 = Date.now();

rmSync(out, { recursive: true, force: true });
const common = {
  absWorkingDir: root,
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  packages: 'external',
  sourcemap: true,
  logLevel: 'warning',
};
await build({ ...common, entryPoints: { index: 'server/index.ts' }, outdir: out });
await build({ ...common, entryPoints: { 'create-owner': 'scripts/create-owner.ts' }, outdir: out });
const migrations = readdirSync(path.join(root, 'server/db/migrations')).filter((f) => /^\d{4}-.*\.ts$/.test(f));
await build({
  ...common,
  entryPoints: migrations.map((f) => `server/db/migrations/${f}`),
  outdir: path.join(out, 'migrations'),
});

// Nothing the production path loads at start-up may come from development only.
const FORBIDDEN = ['tsx', 's3rver', 'smtp-server', 'mailparser', 'vite', 'vitest'];
for (const file of ['index.js', 'create-owner.js']) {
  const code = readFileSync(path.join(out, file), 'utf8');
  for (const name of FORBIDDEN) {
    const staticImport = new RegExp(`^import[^;]*from\\s*["']${name}(/[^"']*)?["']`, 'm');
    if (staticImport.test(code)) throw new Error(`build/server/${file} imports ${name}, a development-only package`);
  }
  if (/seeders\//.test(code)) throw new Error(`build/server/${file} contains demo seeder code`);
}
console.log(
  `[bayslate] server compiled to ${path.relative(root, out)} (${migrations.length} migrations) in ${((Date.now() - t0) / 1000).toFixed(1)} s`,
);
