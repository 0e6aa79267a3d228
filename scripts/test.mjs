// `npm test`: every check and every test on a fresh machine. Installs what is missing (PostgreSQL,
// Chromium, npm packages), then runs two lanes side by side:
//   tests   vite build of the client, then Vitest's unit, API and browser projects (each API or
//           browser run starts its own throwaway cluster and fakes and tears them down)
//   checks  ESLint and the four per-layer type checks (scripts/typecheck-layers.mjs), at a low
//           CPU priority: they use the time the tests leave idle (browser journeys wait on pages,
//           servers and the database) and never slow the tests much.
// Everything runs to its end; the run fails when any lane failed. The checks' output is printed
// after the tests', then a table of where the time went.
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensureChromium, ensureNodeModules, ensurePostgres, log } from './lib/system.mjs';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const node = process.execPath;
const bin = (p) => path.join(root, 'node_modules', p);
// Low priority for the checks (nice 10: a tenth of a test process's share when both want a core).
const CHECK_NICENESS = 10;
const t0 = Date.now();
const timings = [];
const secs = (ms) => (ms / 1000).toFixed(0).padStart(4);

/** Runs node with `args`; `capture` keeps the output for later instead of printing it. */
function run(name, args, { capture = false, nice = 0, env = process.env } = {}) {
  const start = Date.now();
  return new Promise((resolve) => {
    const child = spawn(node, args, { cwd: root, env, stdio: capture ? ['ignore', 'pipe', 'pipe'] : 'inherit' });
    if (nice) {
      try {
        os.setPriority(child.pid, nice);
      } catch {
        // Not allowed here: the checks then run at normal priority, only the timing differs.
      }
    }
    let out = '';
    if (capture) {
      child.stdout.on('data', (c) => (out += c));
      child.stderr.on('data', (c) => (out += c));
    }
    child.on('close', (code, signal) => {
      const ms = Date.now() - start;
      timings.push({ name, ms, ok: code === 0 });
      resolve({ name, ok: code === 0, code: code ?? signal, out, ms });
    });
  });
}

try {
  const s = Date.now();
  ensurePostgres();
  ensureChromium();
  ensureNodeModules(root);
  timings.push({ name: 'setup (packages)', ms: Date.now() - s, ok: true });
} catch (err) {
  console.error(`[bayslate] ${err.message.split('\n')[0]}`);
  process.exit(1);
}

const extra = process.argv.slice(2);
const timingFile = path.join(mkdtempSync(path.join(os.tmpdir(), 'bayslate-test-')), 'timings.json');

log('checks (eslint, per-layer type checks) run beside the tests at low priority; their output follows the tests');
const checks = Promise.all([
  run('lint', [bin('eslint/bin/eslint.js'), '.'], { capture: true, nice: CHECK_NICENESS }),
  run('types', [path.join(root, 'scripts/typecheck-layers.mjs'), '--jobs', '4'], {
    capture: true,
    nice: CHECK_NICENESS,
  }),
]);

async function testsLane() {
  log('building the client for the browser tests…');
  const build = await run('build', [bin('vite/bin/vite.js'), 'build', '--logLevel', 'warn']);
  if (!build.ok) return [build];
  const vitest = await run(
    'vitest',
    [
      bin('vitest/vitest.mjs'),
      'run',
      '--reporter=default',
      `--reporter=${path.join(root, 'scripts/lib/test-timings.mjs')}`,
      ...extra,
    ],
    {
      env: { ...process.env, NODE_ENV: 'test', BAYSLATE_TIMINGS: timingFile },
    },
  );
  return [build, vitest];
}

const [testResults, checkResults] = await Promise.all([testsLane(), checks]);
const results = [...testResults, ...checkResults];
for (const r of checkResults) {
  const text = r.out.trim();
  if (text) process.stdout.write(`\n[bayslate] ${r.name} output:\n${text}\n`);
}

// Where the time went. Vitest's projects run one after another (sequence.groupOrder); each
// project's line runs from its first test file's start to its last one's end.
const byName = Object.fromEntries(timings.map((t) => [t.name, t]));
const rows = ['setup (packages)', 'lint', 'types', 'build', 'vitest'].filter((n) => byName[n]).map((n) => byName[n]);
if (existsSync(timingFile)) {
  const t = JSON.parse(readFileSync(timingFile, 'utf8'));
  const names = Object.keys(t.projects).sort((a, b) => t.projects[a].first - t.projects[b].first);
  if (names.length)
    rows.push({
      name: '  start-up (cluster, template, fakes)',
      ms: Math.min(...names.map((n) => t.projects[n].first)) - t.started,
      ok: true,
    });
  for (const n of names)
    rows.push({
      name: `  ${n} (${t.projects[n].files} files)`,
      ms: t.projects[n].last - t.projects[n].first,
      ok: true,
    });
  rows.push({ name: '  slowest files:', ms: null, ok: true });
  for (const f of [...t.files].sort((a, b) => b.ms - a.ms).slice(0, 5))
    rows.push({ name: `    ${f.file}`, ms: f.ms, ok: f.state !== 'failed' });
  rmSync(path.dirname(timingFile), { recursive: true, force: true });
}
const total = Date.now() - t0;
console.log(
  `\n[bayslate] where the time went (s; lint and types run beside build and vitest; load average now ${os.loadavg()[0].toFixed(1)}):`,
);
for (const r of rows) console.log(`  ${r.name.padEnd(46)}${r.ms === null ? '' : secs(r.ms)}${r.ok ? '' : '  FAILED'}`);
console.log(`  ${'total'.padEnd(46)}${secs(total)}`);

const failed = results.filter((r) => !r.ok);
if (failed.length) {
  console.error(`[bayslate] failed: ${failed.map((r) => r.name).join(', ')}`);
  process.exit(1);
}
log(`all checks and tests passed in ${(total / 1000).toFixed(0)} s`);
