// Type-checks each layer with its own libraries, two at a time (`--jobs N` for another number;
// `npm test` runs all four at once at low priority beside the tests):
//   tsconfig.shared.json  shared/            ES2022 only: no DOM, no Node
//   tsconfig.client.json  src/               DOM and Vite client types, no Node
//   tsconfig.node.json    server/, scripts/  Node types, no DOM
//   tsconfig.tests.json   tests/, configs    both; plain tsc: the tests import components as src/env.d.ts
//                                            declares them, and the components themselves are checked in
//                                            tsconfig.client.json (vue-tsc here checked every component twice)
// (tsconfig.json checks everything at once with both, for editors and a quick look.)
import { spawn } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const vueTsc = path.join(root, 'node_modules/vue-tsc/bin/vue-tsc.js');
const tsc = path.join(root, 'node_modules/typescript/bin/tsc');
// Longest first, so the short ones fill in beside the long ones.
const jobs = [
  [tsc, 'tsconfig.tests.json'],
  [vueTsc, 'tsconfig.client.json'],
  [tsc, 'tsconfig.node.json'],
  [tsc, 'tsconfig.shared.json'],
];
const jobsArg = process.argv.indexOf('--jobs');
const parallel = Math.max(1, jobsArg > 0 ? Number(process.argv[jobsArg + 1]) || 2 : 2);

function run([bin, config]) {
  return new Promise((resolve) => {
    let out = '';
    const child = spawn(process.execPath, [bin, '--noEmit', '-p', config], {
      cwd: root,
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    child.stdout.on('data', (c) => (out += c));
    child.stderr.on('data', (c) => (out += c));
    const start = Date.now();
    child.on('close', (code) => resolve({ config, code, out, s: ((Date.now() - start) / 1000).toFixed(0) }));
  });
}

// A pool of `parallel` slots: the next check starts as soon as one ends.
let failed = false;
const queue = [...jobs];
async function worker() {
  for (let job = queue.shift(); job; job = queue.shift()) {
    const r = await run(job);
    console.log(`${r.config}: ${r.code === 0 ? 'ok' : 'errors'} (${r.s} s)`);
    if (r.code !== 0) {
      failed = true;
      process.stderr.write(`\n${r.config}:\n${r.out}`);
    }
  }
}
await Promise.all(Array.from({ length: parallel }, worker));
if (failed) {
  console.error('type check failed');
  process.exit(1);
}
