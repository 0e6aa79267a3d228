// Episode planner (DESIGN §4.3): proposes an episode order from prerequisites, parts dates and capacity.
import type { Area } from '../domain';
import { criticalPath } from './criticalPath';
import { addDays, fromDay, toDay } from './dates';
import { FitTree } from './fitTree';
import { DayHeap } from './heap';
import { describeEpisode, episodeCapacity, lockEpisodes } from './episodes';
import { prepareUpgrades, roundHours, validHours } from './prepare';
import type { Plan, PlanEpisode, PlannerInput, PlannerUpgrade } from './types';

export { validatePlan } from './validate';
export { episodeCapacity } from './episodes';

/**
 * Dates. New episodes are shot on a grid: slot k is startDate + k × cadence (k ≥ 1, so the shop has
 * one cadence of work before the first shoot), released one cadence after the shoot. Episode numbers
 * are consecutive; a slot is skipped when nothing can be shot then (everything waits on parts), and an
 * oversize upgrade uses as many slots as its hours need at the shop's weekly hours.
 *
 * Locked episodes (fixedEpisodes, and any episode an upgrade's fixedEpisode names) are kept as given;
 * new episodes are numbered after the highest locked one and shot after its shoot date.
 *
 * Choice, per episode: the most urgent available upgrade leads it. Urgency is (priority, then votes,
 * then id), and an upgrade inherits the urgency of anything that needs it, so a prerequisite of a
 * priority-1 upgrade is scheduled like a priority-1 upgrade. The episode is then filled first-fit in
 * urgency order, except that an upgrade of the lead's area is taken ahead of a more-voted one of
 * another area when both have the same (inherited) priority level: that is the "one area per episode
 * where it costs nothing" rule — it never delays a more urgent level. Available means every
 * prerequisite is in an earlier episode or earlier in this one, and parts are due by the shoot date.
 */
export function proposePlan(input: PlannerInput): Plan {
  const { capacity, shopPerSlot } = episodeCapacity(input);
  const cadence = input.releaseCadenceDays;
  const startDay = toDay(input.startDate);
  const prep = prepareUpgrades(input.upgrades);
  if (prep.cycle) return { ok: false, cycle: prep.cycle };
  const { ups, graph: g, order } = prep;
  const n = ups.length;

  const locks = lockEpisodes(input, prep);
  const hoursOf = (i: number) => (validHours(ups[i].estimatedHours) ? ups[i].estimatedHours : 0);

  // Free upgrades are the ones to schedule. One with unusable hours cannot be placed, nor can
  // anything that needs it (it would come before its prerequisite).
  const free = new Uint8Array(n);
  const unplacedMark = new Uint8Array(n);
  for (let k = 0; k < n; k++) {
    const i = order[k];
    if (locks.lockedOf[i] >= 0) continue;
    let blocked = !validHours(ups[i].estimatedHours);
    for (let e = g.predStart[i]; e < g.predStart[i + 1] && !blocked; e++) blocked = unplacedMark[g.predIdx[e]] === 1;
    if (blocked) unplacedMark[i] = 1;
    else free[i] = 1;
  }

  // Own urgency rank, then inherited rank: the best rank among the upgrade and everything free
  // that depends on it, computed in reverse prerequisite order (linear).
  // A missing priority or vote count sorts as the least urgent / no votes rather than poisoning the sort.
  const prio = (i: number) => (Number.isFinite(ups[i].priority) ? ups[i].priority : 5);
  const votes = (i: number) => (Number.isFinite(ups[i].votes) ? ups[i].votes : 0);
  const byOwn = Array.from({ length: n }, (_, i) => i).sort(
    (a, b) => prio(a) - prio(b) || votes(b) - votes(a) || ups[a].id - ups[b].id,
  );
  const ownRank = new Int32Array(n);
  byOwn.forEach((i, r) => (ownRank[i] = r));
  const effRank = Int32Array.from(ownRank);
  for (let k = n - 1; k >= 0; k--) {
    const i = order[k];
    for (let e = g.succStart[i]; e < g.succStart[i + 1]; e++) {
      const s = g.succIdx[e];
      if (free[s] && effRank[s] < effRank[i]) effRank[i] = effRank[s];
    }
  }
  const effLevel = (i: number) => prio(byOwn[effRank[i]]);
  const items = byOwn.filter((i) => free[i]).sort((a, b) => effRank[a] - effRank[b] || ownRank[a] - ownRank[b]);
  const pos = new Int32Array(n).fill(-1);
  items.forEach((i, p) => (pos[i] = p));

  // Availability: count of free prerequisites not yet placed, and the parts day.
  const need = new Int32Array(n);
  const partsDay = new Float64Array(n);
  for (const i of items) {
    partsDay[i] = ups[i].partsDueDate ? toDay(ups[i].partsDueDate!) : -Infinity;
    for (let e = g.predStart[i]; e < g.predStart[i + 1]; e++) if (free[g.predIdx[e]]) need[i]++;
  }
  const all = new FitTree(items.length);
  const byArea = new Map<Area, FitTree>();
  const areaTree = (a: Area) => {
    let t = byArea.get(a);
    if (!t) byArea.set(a, (t = new FitTree(items.length)));
    return t;
  };
  const waiting = new DayHeap();
  const makeAvailable = (i: number) => {
    all.set(pos[i], hoursOf(i));
    areaTree(ups[i].area).set(pos[i], hoursOf(i));
  };
  let shootDay = -Infinity;
  const release = (i: number) => (partsDay[i] <= shootDay ? makeAvailable(i) : waiting.push(partsDay[i], pos[i]));
  for (const i of items) if (need[i] === 0) waiting.push(partsDay[i], pos[i]);

  const episodes: PlanEpisode[] = [...locks.episodes];
  let current: number[] = [];
  const placedMark = new Uint8Array(n);
  let placed = 0;
  const place = (i: number) => {
    current.push(i);
    placedMark[i] = 1;
    placed++;
    all.remove(pos[i]);
    areaTree(ups[i].area).remove(pos[i]);
    for (let e = g.succStart[i]; e < g.succStart[i + 1]; e++) {
      const s = g.succIdx[e];
      if (free[s] && --need[s] === 0) release(s);
    }
  };
  const emit = (number: number, day: number, oversize: boolean) => {
    episodes.push(describeEpisode(number, fromDay(day), addDays(fromDay(day), cadence), current, ups, hoursOf, oversize));
    current = [];
  };

  let number = locks.lastNumber + 1;
  let slot = Math.max(number, Math.floor((locks.lastShootDay - startDay) / cadence) + 1);
  while (placed < items.length) {
    shootDay = startDay + slot * cadence;
    while (waiting.size && waiting.peekDay() <= shootDay) makeAvailable(items[waiting.pop()]);
    if (all.isEmpty()) {
      if (!waiting.size) break; // unreachable for an acyclic graph; kept so bad data cannot loop
      slot = Math.max(slot + 1, Math.ceil((waiting.peekDay() - startDay) / cadence));
      continue;
    }
    const lead = items[all.first()];
    if (hoursOf(lead) > capacity + 1e-9) {
      // Too big for one episode: alone, shot once the shop has had the hours it needs.
      const slots = Math.max(1, Math.ceil(hoursOf(lead) / shopPerSlot - 1e-9));
      shootDay = startDay + (slot + slots - 1) * cadence;
      place(lead);
      emit(number++, shootDay, true);
      slot += slots;
      continue;
    }
    const area = ups[lead].area;
    let room = capacity - hoursOf(lead);
    place(lead);
    for (;;) {
      const best = all.firstFitting(room);
      if (best < 0) break;
      let pick = items[best];
      if (ups[pick].area !== area) {
        const same = byArea.get(area)?.firstFitting(room) ?? -1;
        if (same >= 0 && effLevel(items[same]) === effLevel(pick)) pick = items[same];
      }
      room -= hoursOf(pick);
      place(pick);
    }
    emit(number++, shootDay, false);
    slot++;
  }

  const unplaced: number[] = [];
  for (let i = 0; i < n; i++) if (unplacedMark[i] || (free[i] && !placedMark[i])) unplaced.push(ups[i].id);
  let finish: string | null = null;
  let buildDone: string | null = null;
  for (const ep of episodes) {
    if (!finish || ep.releaseDate > finish) finish = ep.releaseDate;
    if (!buildDone || ep.shootDate > buildDone) buildDone = ep.shootDate;
  }
  return {
    ok: true,
    episodes,
    forecastFinish: finish,
    buildDoneDate: buildDone,
    capacityHours: capacity,
    unplaced,
  };
}

export type MinimumShopDays =
  | { ok: true; hours: number; days: number; critical: number[] }
  | { ok: false; cycle: number[] };

/**
 * The shortest the remaining work can take if every chain of prerequisites ran back to back:
 * the critical path over hours still to do (0 for an installed upgrade, its estimate otherwise),
 * in whole shop days of `hoursPerDay`, rounded up. A lower bound for the forecast, since one bay
 * usually works one upgrade at a time; `critical` names the chain that sets it.
 */
export function minimumShopDays(
  upgrades: readonly Pick<PlannerUpgrade, 'id' | 'estimatedHours' | 'installState' | 'prerequisiteIds'>[],
  hoursPerDay: number,
): MinimumShopDays {
  if (!(hoursPerDay > 0)) throw new RangeError('hoursPerDay must be > 0');
  const known = new Set(upgrades.map((u) => u.id));
  const seen = new Set<number>();
  const tasks = [];
  for (const u of upgrades) {
    if (seen.has(u.id)) continue;
    seen.add(u.id);
    const remaining = u.installState === 'installed' || !validHours(u.estimatedHours) ? 0 : u.estimatedHours;
    const after = (u.prerequisiteIds ?? []).filter((p) => known.has(p)).map(String);
    tasks.push({ id: String(u.id), duration: remaining, after });
  }
  const r = criticalPath(tasks);
  if (!r.ok) return { ok: false, cycle: 'cycle' in r ? r.cycle.map(Number) : [] };
  const hours = roundHours(r.duration);
  return { ok: true, hours, days: hours === 0 ? 0 : Math.ceil(hours / hoursPerDay - 1e-9), critical: r.critical.map(Number) };
}
