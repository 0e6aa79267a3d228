// Type-checks each layer with its own libraries, two at a time:
//   tsconfig.shared.json  shared/            ES2022 only: no DOM, no Node
//   tsconfig.client.json  src/               DOM and Vite client types, no Node
//   tsconfig.node.json    server/, scripts/  Node types, no DOM
//   tsconfig.tests.json   tests/, configs    both
// (tsconfig.json checks everything at once with both, for editors and a quick look.)
import { spawn } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const vueTsc = path.join(root, 'node_modules/vue-tsc/bin/vue-tsc.js');
const tsc = path.join(root, 'node_modules/typescript/bin/tsc');
const jobs = [
  [vueTsc, 'tsconfig.client.json'],
  [tsc, 'tsconfig.shared.json'],
  [tsc, 'tsconfig.node.json'],
  [vueTsc, 'tsconfig.tests.json'],
];

function run([bin, config]) {
  return new Promise((resolve) => {
    let out = '';
    const child = spawn(process.execPath, [bin, '--noEmit', '-p', config], { cwd: root, stdio: ['ignore', 'pipe', 'pipe'] });
    child.stdout.on('data', (c) => (out += c));
    child.stderr.on('data', (c) => (out += c));
    child.on('close', (code) => resolve({ config, code, out }));
  });
}

let failed = false;
for (let i = 0; i < jobs.length; i += 2) {
  for (const r of await Promise.all(jobs.slice(i, i + 2).map(run))) {
    if (r.code !== 0) {
      failed = true;
      process.stderr.write(`\n${r.config}:\n${r.out}`);
    }
  }
}
if (failed) {
  console.error('type check failed');
  process.exit(1);
}
