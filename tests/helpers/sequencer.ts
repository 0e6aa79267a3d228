// The order test files start in. Vitest starts the longest files first once it has run them on this
// machine (its results cache); on a fresh clone it has no durations and starts the largest files
// first, which put the two themes-audit files (small files, long journeys) at the end, where one of
// the two workers ran them alone for half a minute. Here a fresh clone starts the files below in the
// order of their measured time (seconds, quiet 2-core machine, `npm test` on 2026-12-02), longest
// first; a file missing here starts after them (the API files not listed take a second or two). Give
// a new long file its figure, and refresh one when a file's time changes a lot; a wrong figure only
// costs time, never a result.
import path from 'node:path';
import { BaseSequencer, type TestSpecification } from 'vitest/node';

export const MEASURED_SECONDS: Record<string, number> = {
  // e2e
  'tests/e2e/themesProductionAndOverlays.test.ts': 43,
  'tests/e2e/themesSignedOutAndPlanning.test.ts': 37,
  'tests/e2e/backlogRoles.test.ts': 33,
  'tests/e2e/signin.test.ts': 33,
  'tests/e2e/shopFloorOffline.test.ts': 31,
  'tests/e2e/overview.test.ts': 30,
  'tests/e2e/backlog.test.ts': 30,
  'tests/e2e/media.test.ts': 28,
  'tests/e2e/week.test.ts': 26,
  'tests/e2e/viewerStory.test.ts': 24,
  'tests/e2e/shopFloor.test.ts': 22,
  'tests/e2e/planner.test.ts': 15,
  'tests/e2e/sales.test.ts': 12,
  'tests/e2e/failedMail.test.ts': 10,
  'tests/e2e/plannerSlips.test.ts': 10,
  // api: the long ones (the rest take a second or two and fill in after them)
  'tests/api/deploy-restart.test.ts': 14,
  'tests/api/keepAlive.test.ts': 7,
  'tests/api/hardening-mail.test.ts': 6,
  'tests/api/authz-matrix.test.ts': 5,
  'tests/api/sales.test.ts': 5,
  'tests/api/instances.test.ts': 5,
  'tests/api/deploy-safety.test.ts': 4,
};

export default class LongestFirst extends BaseSequencer {
  async sort(files: TestSpecification[]): Promise<TestSpecification[]> {
    const sorted = await super.sort(files);
    const root = this.ctx.config.root;
    const key = (f: TestSpecification) => path.relative(root, f.moduleId).split(path.sep).join('/');
    const seen = (f: TestSpecification) => Boolean(this.ctx.cache.getFileTestResults(`${f.project.name}:${key(f)}`));
    // Per project: once Vitest has durations for every file it orders them itself (above).
    const projects = new Map<string, TestSpecification[]>();
    for (const f of sorted) projects.set(f.project.name, [...(projects.get(f.project.name) ?? []), f]);
    const out: TestSpecification[] = [];
    for (const group of projects.values()) {
      if (group.every(seen)) {
        out.push(...group);
        continue;
      }
      const expected = (f: TestSpecification) => MEASURED_SECONDS[key(f)] ?? 0;
      // A stable sort: files with the same figure (the unlisted ones) keep Vitest's order.
      out.push(
        ...group
          .map((f, i) => ({ f, i }))
          .sort((a, b) => expected(b.f) - expected(a.f) || a.i - b.i)
          .map((x) => x.f),
      );
    }
    return out;
  }
}
