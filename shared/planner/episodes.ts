// Locked episodes (fixed by shooting or by installed upgrades) and the summary line of any episode.
import type { Area } from '../domain';
import { addDays, fromDay, toDay } from './dates';
import type { PreparedUpgrades } from './prepare';
import { roundHours } from './prepare';
import type { PlanEpisode, PlannerInput, PlannerUpgrade } from './types';

/** Hours one new episode may hold, and shop hours available between two shoot slots. */
export function episodeCapacity(
  input: Pick<PlannerInput, 'shootHoursPerEpisode' | 'releaseCadenceDays' | 'shopHoursPerWeek'>,
) {
  const { shootHoursPerEpisode: shoot, releaseCadenceDays: cadence, shopHoursPerWeek: shop } = input;
  if (!(Number.isInteger(cadence) && cadence >= 1))
    throw new RangeError('releaseCadenceDays must be a whole number ≥ 1');
  if (!(shoot > 0) || !(shop > 0)) throw new RangeError('shootHoursPerEpisode and shopHoursPerWeek must be > 0');
  const shopPerSlot = (shop * cadence) / 7;
  return { capacity: Math.min(shoot, shopPerSlot), shopPerSlot };
}

export interface Locks {
  /** Episode number each upgrade (by index) is locked into, −1 when the planner may place it. */
  lockedOf: Int32Array;
  /** Locked episodes by number, kept as given. */
  episodes: PlanEpisode[];
  lastNumber: number;
  lastShootDay: number;
}

/**
 * An episode of input.fixedEpisodes keeps its dates and its running order (ids that name no upgrade
 * are dropped). An upgrade whose fixedEpisode names an episode is added to it, after the listed
 * ones and in prerequisite order; if that episode is not in fixedEpisodes it is created on the
 * date grid. When the two disagree the episode's own list wins: it is what was shot.
 */
export function lockEpisodes(input: PlannerInput, prep: PreparedUpgrades): Locks {
  const { ups, index } = prep;
  const n = ups.length;
  const cadence = input.releaseCadenceDays;
  const startDay = toDay(input.startDate);
  const lockedOf = new Int32Array(n).fill(-1);
  const lists = new Map<number, { shootDate: string; releaseDate: string; members: number[] }>();
  const entry = (number: number, shootDate?: string | null, releaseDate?: string | null) => {
    let e = lists.get(number);
    if (!e) {
      const shoot = shootDate ?? fromDay(startDay + number * cadence);
      e = { shootDate: shoot, releaseDate: releaseDate ?? addDays(shoot, cadence), members: [] };
      lists.set(number, e);
    }
    return e;
  };
  for (const ep of input.fixedEpisodes ?? []) {
    const e = entry(ep.number, ep.shootDate, ep.releaseDate);
    for (const id of ep.upgradeIds) {
      const i = index.get(id);
      if (i === undefined || lockedOf[i] >= 0) continue;
      lockedOf[i] = ep.number;
      e.members.push(i);
    }
  }
  const extra = new Map<number, number[]>();
  for (let i = 0; i < n; i++) {
    const fe = ups[i].fixedEpisode;
    if (fe == null || lockedOf[i] >= 0 || !(Number.isInteger(fe) && fe >= 1)) continue;
    lockedOf[i] = fe;
    if (!extra.has(fe)) extra.set(fe, []);
    extra.get(fe)!.push(i);
  }
  for (const [fe, list] of extra) entry(fe).members.push(...prerequisitesFirst(list, prep));
  const hoursOf = (i: number) => (Number.isFinite(ups[i].estimatedHours) ? Math.max(0, ups[i].estimatedHours) : 0);
  const episodes: PlanEpisode[] = [];
  let lastNumber = 0;
  let lastShootDay = -Infinity;
  for (const number of [...lists.keys()].sort((a, b) => a - b)) {
    const e = lists.get(number)!;
    const ep = describeEpisode(number, e.shootDate, e.releaseDate, e.members, ups, hoursOf, false);
    ep.locked = true;
    episodes.push(ep);
    lastNumber = Math.max(lastNumber, number);
    lastShootDay = Math.max(lastShootDay, toDay(e.shootDate));
  }
  return { lockedOf, episodes, lastNumber, lastShootDay };
}

/** Totals an episode's hours and names its dominant area: most hours, ties to the first in running order. */
export function describeEpisode(
  number: number,
  shootDate: string,
  releaseDate: string,
  members: readonly number[],
  ups: readonly PlannerUpgrade[],
  hoursOf: (i: number) => number,
  oversize: boolean,
): PlanEpisode {
  const byArea = new Map<Area, number>();
  let hours = 0;
  for (const i of members) {
    hours += hoursOf(i);
    byArea.set(ups[i].area, (byArea.get(ups[i].area) ?? 0) + hoursOf(i));
  }
  let area: Area | null = null;
  let most = -1;
  for (const [a, h] of byArea) {
    if (h > most + 1e-9) {
      area = a;
      most = h;
    }
  }
  return {
    number,
    shootDate,
    releaseDate,
    area,
    hours: roundHours(hours),
    upgradeIds: members.map((i) => ups[i].id),
    locked: false,
    oversize,
  };
}

/**
 * Orders a few upgrades so each comes after its prerequisites among them, lowest id first where free,
 * so the result does not depend on input order. Quadratic, but only ever run on one episode's upgrades.
 */
function prerequisitesFirst(list: number[], prep: PreparedUpgrades): number[] {
  const g = prep.graph;
  const left = new Set(list);
  const out: number[] = [];
  while (left.size) {
    let pick = -1;
    for (const i of left) {
      let ready = true;
      for (let e = g.predStart[i]; e < g.predStart[i + 1] && ready; e++) ready = !left.has(g.predIdx[e]);
      if (ready && (pick < 0 || prep.ups[i].id < prep.ups[pick].id)) pick = i;
    }
    if (pick < 0) pick = [...left][0]; // only on a cycle, which the planner refuses before this
    left.delete(pick);
    out.push(pick);
  }
  return out;
}
