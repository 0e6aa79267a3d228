// A Vitest reporter for `npm test`'s closing summary: when each project's first test file started
// and its last one ended (wall clock, ms since the epoch), the sum of its files' own durations,
// and each file's duration. Writes JSON to the file named by BAYSLATE_TIMINGS.
import { writeFileSync } from 'node:fs';

export default class TestTimings {
  started = Date.now();
  projects = {};
  files = [];

  onTestModuleStart(mod) {
    const name = mod.project.name || 'default';
    const p = (this.projects[name] ??= { first: Date.now(), last: 0, files: 0, fileMs: 0 });
    p.first = Math.min(p.first, Date.now());
  }

  onTestModuleEnd(mod) {
    const name = mod.project.name || 'default';
    const p = (this.projects[name] ??= { first: Date.now(), last: 0, files: 0, fileMs: 0 });
    const ms = mod.diagnostic().duration ?? 0;
    p.last = Math.max(p.last, Date.now());
    p.files += 1;
    p.fileMs += ms;
    this.files.push({
      project: name,
      file: mod.relativeModuleId ?? mod.moduleId,
      ms: Math.round(ms),
      state: mod.state(),
    });
  }

  onTestRunEnd() {
    const out = process.env.BAYSLATE_TIMINGS;
    if (!out) return;
    writeFileSync(
      out,
      JSON.stringify({ started: this.started, ended: Date.now(), projects: this.projects, files: this.files }, null, 1),
    );
  }
}
