// What was seen (4): `npm ci` warned about engines — installed packages that need a newer Node
// than the one running, while our own `engines` said ">=20". And (3): the local fakes were
// production dependencies. Reads every installed package's package.json, as npm does.
import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';

const root = path.resolve(import.meta.dirname, '../..');
const semver = createRequire(import.meta.url)('semver') as { satisfies: (v: string, r: string, o?: object) => boolean };
const pkg = JSON.parse(readFileSync(path.join(root, 'package.json'), 'utf8'));

/** Every package folder under node_modules, nested ones included. */
function installed(dir: string, out: string[] = []): string[] {
  if (!existsSync(dir)) return out;
  for (const name of readdirSync(dir)) {
    if (name.startsWith('.')) continue;
    const p = path.join(dir, name);
    if (name.startsWith('@')) {
      installed(p, out);
      continue;
    }
    if (existsSync(path.join(p, 'package.json'))) out.push(p);
    installed(path.join(p, 'node_modules'), out);
  }
  return out;
}

describe('packages', () => {
  it('every installed package accepts this Node (no engine warning from npm ci)', () => {
    const bad: string[] = [];
    for (const dir of installed(path.join(root, 'node_modules'))) {
      const meta = JSON.parse(readFileSync(path.join(dir, 'package.json'), 'utf8'));
      const want = meta.engines?.node;
      if (typeof want === 'string' && !semver.satisfies(process.version, want, { includePrerelease: true }))
        bad.push(`${meta.name}@${meta.version} wants node ${want}`);
    }
    expect(bad).toEqual([]);
  });

  it('our own engines field is true for this Node and for the lowest Node it names', () => {
    expect(semver.satisfies(process.version, pkg.engines.node)).toBe(true);
    expect(pkg.engines.node).toMatch(/20/);
  });

  it('the local fakes and the TypeScript runner are development dependencies only', () => {
    for (const name of ['s3rver', 'smtp-server', 'mailparser', 'tsx']) {
      expect(pkg.dependencies[name], name).toBeUndefined();
      expect(pkg.devDependencies[name], name).toBeDefined();
    }
  });
});
