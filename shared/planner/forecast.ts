// The build's forecast finish with one bay: prerequisites, part arrival dates (release times) and
// the shop's weekly hours, and what drives the date (a late part, or the hours themselves).
import { criticalPath } from './criticalPath';

export interface ForecastTask {
  id: number;
  /** Hours still to do (0 for an installed upgrade). */
  hours: number;
  /** Calendar days from today until it may start (its parts are due); 0 when nothing holds it back. */
  release: number;
  prerequisiteIds: number[];
}

export type BayForecast =
  | {
      ok: true;
      /** Calendar days from today until the last upgrade is installed, one bay at the weekly hours. */
      days: number;
      /** Calendar days of the longest chain of prerequisites and part waits, bay capacity ignored. */
      chainDays: number;
      /** The chain that sets the finish: prerequisites of the upgrade that opens the last stretch of
       *  work, that upgrade, then the work after it, in bay order. */
      critical: number[];
      /** The upgrade whose part arrival opens the last stretch of work; null when the hours decide. */
      drivenByRelease: number | null;
      /** Every upgrade with hours, in the order one bay would work them. */
      order: number[];
    }
  | { ok: false; cycle: number[] };

const EPS = 1e-9;

/**
 * One bay works one upgrade at a time. Scheduling by earliest "modified release" (each upgrade's
 * release pushed to the early finish of its prerequisites, which is the forward pass of the critical
 * path with release times) and starting each as soon as the bay and its release allow gives the
 * shortest finish for one machine with release dates and precedence (Lawler 1973, the problem
 * 1|prec, r_j|C_max). Durations are calendar days: hours × 7 / weekly hours, so a week's shop
 * hours are spread evenly over the week.
 */
export function bayForecast(tasks: readonly ForecastTask[], shopHoursPerWeek: number): BayForecast {
  if (!(shopHoursPerWeek > 0)) throw new RangeError('shopHoursPerWeek must be > 0');
  const known = new Set(tasks.map((t) => t.id));
  const seen = new Set<number>();
  const list: ForecastTask[] = [];
  for (const t of tasks) {
    if (seen.has(t.id)) continue;
    seen.add(t.id);
    list.push(t);
  }
  const daysOf = (h: number) => (Number.isFinite(h) && h > 0 ? (h * 7) / shopHoursPerWeek : 0);
  const cpm = criticalPath(
    list.map((t) => ({
      id: String(t.id),
      duration: daysOf(t.hours),
      release: Math.max(0, Number.isFinite(t.release) ? t.release : 0),
      after: t.prerequisiteIds.filter((p) => known.has(p)).map(String),
    })),
  );
  if (!cpm.ok) return { ok: false, cycle: 'cycle' in cpm ? cpm.cycle.map(Number) : [] };

  const position = new Map(cpm.order.map((id, k) => [id, k]));
  const work = list.filter((t) => daysOf(t.hours) > 0).map((t) => String(t.id));
  work.sort((a, b) => cpm.tasks[a].es - cpm.tasks[b].es || position.get(a)! - position.get(b)!);
  let clock = 0;
  let blockStart = -1;
  for (let k = 0; k < work.length; k++) {
    const es = cpm.tasks[work[k]].es;
    if (k === 0 || es > clock + EPS) blockStart = k; // the bay waited: a new stretch of work opens
    clock = Math.max(clock, es) + cpm.tasks[work[k]].ef - es;
  }
  const days = Math.max(clock, cpm.duration);
  if (blockStart < 0)
    return { ok: true, days, chainDays: cpm.duration, critical: [], drivenByRelease: null, order: [] };

  // What opened the last stretch: follow the binding constraint of its early start back to a release.
  const byId = new Map(list.map((t) => [String(t.id), t]));
  const chain: string[] = [];
  let at: string | undefined = work[blockStart];
  let driver: number | null = null;
  while (at) {
    chain.unshift(at);
    const t: ForecastTask = byId.get(at)!;
    const es: number = cpm.tasks[at].es;
    if (es <= EPS) break;
    const release = Math.max(0, t.release);
    if (Math.abs(release - es) < EPS) {
      driver = t.id;
      break;
    }
    at = t.prerequisiteIds.map(String).find((p: string) => byId.has(p) && Math.abs(cpm.tasks[p].ef - es) < EPS);
  }
  const critical = [...chain, ...work.slice(blockStart + 1)].map(Number);
  return { ok: true, days, chainDays: cpm.duration, critical, drivenByRelease: driver, order: work.map(Number) };
}
