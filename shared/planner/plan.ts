// Episode planner (DESIGN §4.3): proposes an episode order from prerequisites, parts dates and capacity.
import type { Area } from '../domain';
import { criticalPath } from './criticalPath';
import { addDays, fromDay, toDay } from './dates';
import { FitTree } from './fitTree';
import { DayHeap } from './heap';
import { describeEpisode, episodeCapacity, lockEpisodes } from './episodes';
import { prepareUpgrades, roundHours, validHours } from './prepare';
import type { Plan, PlanEpisode, PlanMethod, PlannerInput, PlannerUpgrade } from './types';

export { validatePlan } from './validate';

/** Builds up to this many upgrades also get the chain-order pass (keeps 2,000 upgrades fast). */
const CHAIN_ORDER_MAX = 400;

/** How many same-level candidates the best-fit fill compares per pick (keeps the planner near-linear). */
const FIT_CANDIDATES = 6;
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
  const first = planWith(input, 'priority');
  if (!first.ok || input.upgrades.length > CHAIN_ORDER_MAX) return first;
  // A second pass that ranks by the longest chain of work still behind each upgrade (the classic
  // list-scheduling rule for an early finish). It is kept only when it finishes strictly earlier:
  // otherwise the producer's priorities and votes decide.
  const second = planWith(input, 'chain');
  if (
    second.ok &&
    second.forecastFinish !== null &&
    first.forecastFinish !== null &&
    second.forecastFinish < first.forecastFinish
  )
    return second;
  return first;
}

function planWith(input: PlannerInput, method: PlanMethod): Plan {
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

  // Own urgency rank: priority, then votes, then id. A missing priority or vote count sorts as the
  // least urgent / no votes rather than poisoning the sort.
  const prio = (i: number) => (Number.isFinite(ups[i].priority) ? ups[i].priority : 5);
  const votes = (i: number) => (Number.isFinite(ups[i].votes) ? ups[i].votes : 0);
  const byPriority = (a: number, b: number) => prio(a) - prio(b) || votes(b) - votes(a) || ups[a].id - ups[b].id;
  let byOwn = Array.from({ length: n }, (_, i) => i).sort(byPriority);
  if (method === 'chain') {
    // Hours of the longest chain from each upgrade through everything that needs it (reverse order).
    const tail = new Float64Array(n);
    for (let k = n - 1; k >= 0; k--) {
      const i = order[k];
      let most = 0;
      for (let e = g.succStart[i]; e < g.succStart[i + 1]; e++) most = Math.max(most, tail[g.succIdx[e]]);
      tail[i] = hoursOf(i) + most;
    }
    byOwn = byOwn.slice().sort((a, b) => tail[b] - tail[a] || byPriority(a, b));
  }
  const ownRank = new Int32Array(n);
  byOwn.forEach((i, r) => (ownRank[i] = r));

  // Ready day: the latest parts day of an upgrade and of every free prerequisite (linear, in order).
  const partsDay = new Float64Array(n).fill(-Infinity);
  const readyDay = new Float64Array(n).fill(-Infinity);
  for (let k = 0; k < n; k++) {
    const i = order[k];
    if (!free[i]) continue;
    partsDay[i] = ups[i].partsDueDate ? toDay(ups[i].partsDueDate!) : -Infinity;
    let r = partsDay[i];
    for (let e = g.predStart[i]; e < g.predStart[i + 1]; e++)
      if (free[g.predIdx[e]]) r = Math.max(r, readyDay[g.predIdx[e]]);
    readyDay[i] = r;
  }
  // Inherited urgency: the best rank among the upgrade and everything free that depends on it, and
  // the ready day of the dependant it comes from (reverse prerequisite order, linear). A prerequisite
  // takes that urgency only from one cadence before its dependant can be shot: earlier, a dependant
  // still waiting weeks for parts would take a slot from something shootable now.
  const fullRank = Int32Array.from(ownRank);
  const promoteDay = new Float64Array(n).fill(-Infinity);
  for (let k = n - 1; k >= 0; k--) {
    const i = order[k];
    if (!free[i]) continue;
    for (let e = g.succStart[i]; e < g.succStart[i + 1]; e++) {
      const s = g.succIdx[e];
      if (!free[s]) continue;
      const day = fullRank[s] === ownRank[s] ? readyDay[s] : promoteDay[s];
      if (
        fullRank[s] < fullRank[i] ||
        (fullRank[s] === fullRank[i] && fullRank[i] !== ownRank[i] && day < promoteDay[i])
      ) {
        fullRank[i] = fullRank[s];
        promoteDay[i] = day;
      }
    }
  }

  // Rank positions: every free upgrade has its own-rank position and, when it can inherit, an
  // inherited one; it sits in exactly one of them while available.
  const entries: { i: number; r: number }[] = [];
  for (const i of byOwn) {
    if (!free[i]) continue;
    entries.push({ i, r: ownRank[i] });
    if (fullRank[i] < ownRank[i]) entries.push({ i, r: fullRank[i] });
  }
  entries.sort((a, b) => a.r - b.r || ownRank[a.i] - ownRank[b.i]);
  const itemAt = new Int32Array(entries.length);
  const levelAt = new Float64Array(entries.length);
  const posOwn = new Int32Array(n).fill(-1);
  const posInherited = new Int32Array(n).fill(-1);
  entries.forEach((en, p) => {
    itemAt[p] = en.i;
    levelAt[p] = prio(byOwn[en.r]);
    if (en.r === ownRank[en.i]) posOwn[en.i] = p;
    else posInherited[en.i] = p;
  });
  let freeCount = 0;
  for (let i = 0; i < n; i++) if (free[i]) freeCount++;

  // Availability: count of free prerequisites not yet placed, and the parts day.
  const need = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    if (!free[i]) continue;
    for (let e = g.predStart[i]; e < g.predStart[i + 1]; e++) if (free[g.predIdx[e]]) need[i]++;
  }
  const all = new FitTree(entries.length);
  const byArea = new Map<Area, FitTree>();
  const areaTree = (a: Area) => {
    let t = byArea.get(a);
    if (!t) byArea.set(a, (t = new FitTree(entries.length)));
    return t;
  };
  const waiting = new DayHeap();
  const promotions = new DayHeap();
  const at = new Int32Array(n).fill(-1);
  let shootDay = -Infinity;
  const inherits = (i: number) => posInherited[i] >= 0 && promoteDay[i] - cadence <= shootDay;
  const setAt = (i: number, p: number) => {
    at[i] = p;
    all.set(p, hoursOf(i));
    areaTree(ups[i].area).set(p, hoursOf(i));
  };
  const clearAt = (i: number) => {
    all.remove(at[i]);
    areaTree(ups[i].area).remove(at[i]);
    at[i] = -1;
  };
  const makeAvailable = (i: number) => setAt(i, inherits(i) ? posInherited[i] : posOwn[i]);
  const release = (i: number) => (partsDay[i] <= shootDay ? makeAvailable(i) : waiting.push(partsDay[i], i));
  for (let i = 0; i < n; i++) {
    if (!free[i]) continue;
    if (need[i] === 0) waiting.push(partsDay[i], i);
    if (posInherited[i] >= 0 && promoteDay[i] > -Infinity) promotions.push(promoteDay[i] - cadence, i);
  }

  const episodes: PlanEpisode[] = [...locks.episodes];
  let current: number[] = [];
  const placedMark = new Uint8Array(n);
  let placed = 0;
  const place = (i: number) => {
    current.push(i);
    placedMark[i] = 1;
    placed++;
    clearAt(i);
    for (let e = g.succStart[i]; e < g.succStart[i + 1]; e++) {
      const s = g.succIdx[e];
      if (free[s] && --need[s] === 0) release(s);
    }
  };
  const emit = (number: number, day: number, oversize: boolean) => {
    episodes.push(
      describeEpisode(number, fromDay(day), addDays(fromDay(day), cadence), current, ups, hoursOf, oversize),
    );
    current = [];
  };

  let number = locks.lastNumber + 1;
  let slot = Math.max(number, Math.floor((locks.lastShootDay - startDay) / cadence) + 1);
  while (placed < freeCount) {
    shootDay = startDay + slot * cadence;
    while (waiting.size && waiting.peekDay() <= shootDay) makeAvailable(waiting.pop());
    while (promotions.size && promotions.peekDay() <= shootDay) {
      const i = promotions.pop();
      if (at[i] >= 0 && at[i] === posOwn[i]) {
        clearAt(i);
        setAt(i, posInherited[i]);
      }
    }
    if (all.isEmpty()) {
      if (!waiting.size) break; // unreachable for an acyclic graph; kept so bad data cannot loop
      slot = Math.max(slot + 1, Math.ceil((waiting.peekDay() - startDay) / cadence));
      continue;
    }
    const lead = itemAt[all.first()];
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
      const first = all.firstFitting(room);
      if (first < 0) break;
      // Best fit within the most urgent level that still fits: the largest of its next few
      // candidates, so small upgrades do not strand the room a larger one of the same level needed.
      const level = levelAt[first];
      let best = first;
      for (let c = 0, p = first; c < FIT_CANDIDATES; c++) {
        p = all.nextFitting(room, p + 1);
        if (p < 0 || levelAt[p] !== level) break;
        if (hoursOf(itemAt[p]) > hoursOf(itemAt[best]) + 1e-9) best = p;
      }
      let pick = itemAt[best];
      if (ups[pick].area !== area) {
        // One area per episode where it costs nothing: a same-area upgrade of the same level is taken
        // instead only when it is as large, or the other one still fits beside it.
        const same = byArea.get(area)?.firstFitting(room) ?? -1;
        if (same >= 0 && levelAt[same] === level) {
          const alt = itemAt[same];
          if (hoursOf(alt) >= hoursOf(pick) - 1e-9 || hoursOf(pick) <= room - hoursOf(alt) + 1e-9) pick = alt;
        }
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
    method,
    episodes,
    forecastFinish: finish,
    buildDoneDate: buildDone,
    capacityHours: capacity,
    unplaced,
  };
}

export type MinimumShopDays =
  { ok: true; hours: number; days: number; critical: number[] } | { ok: false; cycle: number[] };

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
  return {
    ok: true,
    hours,
    days: hours === 0 ? 0 : Math.ceil(hours / hoursPerDay - 1e-9),
    critical: r.critical.map(Number),
  };
}
