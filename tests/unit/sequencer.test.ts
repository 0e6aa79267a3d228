// The order test files start in on a fresh clone (tests/helpers/sequencer.ts): measured files
// longest first, unlisted ones after them; once Vitest has durations for a project, its order.
import { describe, it, expect } from 'vitest';
import path from 'node:path';
import type { TestSpecification } from 'vitest/node';
import LongestFirst from '../helpers/sequencer';

const root = '/repo';
function spec(project: string, file: string, groupOrder: number): TestSpecification {
  return {
    moduleId: path.join(root, file),
    project: { name: project, config: { sequence: { groupOrder }, isolate: false } },
  } as unknown as TestSpecification;
}
function sequencer(known: Record<string, number> = {}) {
  const ctx = {
    config: { root },
    cache: {
      getFileTestResults: (k: string) => (k in known ? { failed: false, duration: known[k] } : undefined),
      // A fresh clone: Vitest knows each file's size, nothing else.
      getFileStats: () => ({ size: 1 }),
    },
  };
  return new LongestFirst(ctx as never);
}
const names = (files: TestSpecification[]) => files.map((f) => path.relative(root, f.moduleId));

describe('the order of test files', () => {
  it('a fresh clone starts the measured browser files longest first, an unlisted file after them', async () => {
    const files = [
      spec('e2e', 'tests/e2e/plannerSlips.test.ts', 2),
      spec('e2e', 'tests/e2e/signin.test.ts', 2),
      spec('e2e', 'tests/e2e/brandNew.test.ts', 2),
      spec('e2e', 'tests/e2e/themesProductionAndOverlays.test.ts', 2),
      spec('unit', 'tests/unit/vin.test.ts', 0),
    ];
    expect(names(await sequencer().sort(files))).toEqual([
      'tests/unit/vin.test.ts',
      'tests/e2e/themesProductionAndOverlays.test.ts',
      'tests/e2e/signin.test.ts',
      'tests/e2e/plannerSlips.test.ts',
      'tests/e2e/brandNew.test.ts',
    ]);
  });

  it('once every file of a project has run here, Vitest’s own order (longest measured here first) stands', async () => {
    const files = [spec('e2e', 'tests/e2e/signin.test.ts', 2), spec('e2e', 'tests/e2e/plannerSlips.test.ts', 2)];
    const known = { 'e2e:tests/e2e/signin.test.ts': 5_000, 'e2e:tests/e2e/plannerSlips.test.ts': 60_000 };
    expect(names(await sequencer(known).sort(files))).toEqual([
      'tests/e2e/plannerSlips.test.ts',
      'tests/e2e/signin.test.ts',
    ]);
  });
});
