// The sign-in route loads at most 250 KB of gzipped JavaScript (DESIGN §8); other routes are lazy.
import { describe, it, expect } from 'vitest';
import { existsSync, readFileSync } from 'node:fs';
import { gzipSync } from 'node:zlib';
import path from 'node:path';

const dist = path.resolve(import.meta.dirname, '../../dist');

describe('client bundle', () => {
  it('the sign-in route loads under 250 KB of gzipped JavaScript', () => {
    expect(existsSync(path.join(dist, 'index.html')), 'dist/ is missing: npm test builds it first').toBe(true);
    const html = readFileSync(path.join(dist, 'index.html'), 'utf8');
    const scripts = [...html.matchAll(/<(?:script[^>]+src|link[^>]+rel="modulepreload"[^>]+href)="([^"]+\.js)"/g)].map(
      (m) => m[1],
    );
    expect(scripts.length).toBeGreaterThan(0);
    const total = scripts.reduce((sum, s) => sum + gzipSync(readFileSync(path.join(dist, s))).length, 0);
    console.log(`sign-in route: ${scripts.length} scripts, ${(total / 1024).toFixed(1)} KB gzipped`);
    expect(total).toBeLessThan(250 * 1024);
  });

  it('screens other than sign-in are separate lazy chunks', () => {
    const html = readFileSync(path.join(dist, 'index.html'), 'utf8');
    expect(html).not.toMatch(/UsersView|BuildsView|AppLayout/);
  });
});
