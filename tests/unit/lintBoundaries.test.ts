// The layer boundaries of eslint.config.js do fail: each snippet below, linted as if it were a
// file at the given place, breaks one boundary and must be reported with that rule; the same
// import from a place where it is allowed must not be.
import { describe, it, expect } from 'vitest';
import { ESLint } from 'eslint';
import path from 'node:path';

const root = path.resolve(import.meta.dirname, '../..');
const eslint = new ESLint({ cwd: root });

async function rulesHit(file: string, code: string): Promise<string[]> {
  const [r] = await eslint.lintText(code, { filePath: path.join(root, file) });
  return r.messages.filter((m) => m.severity === 2).map((m) => m.ruleId ?? `parse: ${m.message}`);
}

describe('layer boundaries (eslint.config.js)', { timeout: 60_000 }, () => {
  it('shared/ may not import server code, client code or Node modules', async () => {
    expect(
      await rulesHit(
        'shared/boundaryProbe.ts',
        `import { config } from '../server/config';\nexport const x = config;\n`,
      ),
    ).toContain('import-x/no-restricted-paths');
    expect(
      await rulesHit(
        'shared/boundaryProbe.ts',
        `import { formatCents } from '../src/theme';\nexport const x = formatCents;\n`,
      ),
    ).toContain('import-x/no-restricted-paths');
    expect(
      await rulesHit(
        'shared/boundaryProbe.ts',
        `import { readFileSync } from 'node:fs';\nexport const x = readFileSync;\n`,
      ),
    ).toContain('no-restricted-imports');
    expect(
      await rulesHit(
        'shared/boundaryProbe.ts',
        `import { z } from 'zod';\nimport { ROLES } from './domain';\nexport const x = [z, ROLES];\n`,
      ),
    ).toEqual([]);
  });

  it('a service may not import express, multer, middleware or routes', async () => {
    expect(
      await rulesHit(
        'server/services/boundaryProbe.ts',
        `import type { Request } from 'express';\nexport type X = Request;\n`,
      ),
    ).toContain('no-restricted-imports');
    expect(
      await rulesHit('server/services/boundaryProbe.ts', `import multer from 'multer';\nexport const x = multer;\n`),
    ).toContain('no-restricted-imports');
    expect(
      await rulesHit(
        'server/services/boundaryProbe.ts',
        `import { requireRole } from '../middleware/roles';\nexport const x = requireRole;\n`,
      ),
    ).toContain('import-x/no-restricted-paths');
    expect(
      await rulesHit(
        'server/services/boundaryProbe.ts',
        `import { upgradesRouter } from '../routes/upgrades';\nexport const x = upgradesRouter;\n`,
      ),
    ).toContain('import-x/no-restricted-paths');
    // The same imports are fine in a route.
    expect(
      await rulesHit(
        'server/routes/boundaryProbe.ts',
        `import type { Request } from 'express';\nimport { requireRole } from '../middleware/roles';\nexport type X = Request;\nexport const x = requireRole;\n`,
      ),
    ).toEqual([]);
  });

  it('a storage or mail adapter may not import a route', async () => {
    expect(
      await rulesHit(
        'server/storage/boundaryProbe.ts',
        `import { healthRouter } from '../routes/health';\nexport const x = healthRouter;\n`,
      ),
    ).toContain('import-x/no-restricted-paths');
    expect(
      await rulesHit(
        'server/mail/boundaryProbe.ts',
        `import { healthRouter } from '../routes/health';\nexport const x = healthRouter;\n`,
      ),
    ).toContain('import-x/no-restricted-paths');
  });

  it('an import cycle is reported', async () => {
    // shared/schemas/episode.ts imports shared/domain.ts; a domain.ts that imported episode.ts
    // would close a loop.
    const hits = await rulesHit(
      'shared/domain.ts',
      `import { planSchema } from './schemas/episode';\nexport const x = planSchema;\n`,
    );
    expect(hits).toContain('import-x/no-cycle');
  });
});
