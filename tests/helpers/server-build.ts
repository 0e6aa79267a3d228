// Vitest global setup for the browser tests: compiles the server once per run with esbuild
// (scripts/build-server.mjs, as `npm run build` does) into a folder of this run's own, so each
// journey's server starts from one bundle instead of loading every source file through tsx.
// Always rebuilt, so the journeys test the sources as they are now.
import { execFileSync } from 'node:child_process';
import { rmSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import type { TestProject } from 'vitest/node';

declare module 'vitest' {
  export interface ProvidedContext {
    /** Folder holding the compiled server's index.js (tests/helpers/browser.ts starts it). */
    appServerBuild: string;
  }
}

const root = path.resolve(import.meta.dirname, '../..');

export default function setup(project: TestProject) {
  const dir = path.join(root, '.data', `e2e-server-${process.pid}-${randomBytes(3).toString('hex')}`);
  const out = path.join(dir, 'server');
  execFileSync(process.execPath, ['scripts/build-server.mjs', '--out', out], { cwd: root, stdio: 'pipe' });
  project.provide('appServerBuild', out);
  return () => rmSync(dir, { recursive: true, force: true });
}
