// The episode plan of a build: what the planner screen reads, the check, and a proposal from the pure
// planner. Applying a plan (and taking it back) is planApply.ts.
import { QueryTypes } from 'sequelize';
import { sequelize, type Build } from '../models';
import { AppError } from '../errors';
import { LOCKED_STATES } from './episodes';
import { capacityOf, currentPlan, loadPlanData, plannerInput, today, type Capacity, type PlanData } from './planData';
import {
  minimumShopDays,
  proposePlan,
  validatePlan,
  type PlannerInput,
  type PlanViolation,
} from '../../shared/planner/index';
import { findCycle } from '../../shared/planner/criticalPath';
import { bayForecast } from '../../shared/planner/forecast';
import { toDay } from '../../shared/planner/dates';
import { AREA_LABELS } from '../../shared/domain';
import type { PlanDifference, ProposedEpisode } from '../../shared/contracts/plan';
import { planVersion, lastUndoable, changeSummary } from './planRevisions';
import { addDays } from '../../shared/dates';

/** Five shop days a week (common practice), so a shop day is a fifth of the weekly hours. */
export const SHOP_DAYS_PER_WEEK = 5;

/** Whole days from one ISO date to another (negative when `to` is earlier). */
const daysBetween = (from: string, to: string) => toDay(to) - toDay(from);

function cycleTitles(data: PlanData, ids: number[]) {
  const title = new Map(data.upgrades.map((u) => [u.id, u.title]));
  return ids.map((id) => title.get(id) ?? `#${id}`);
}

/** A prerequisite cycle makes every plan impossible: 422 naming the upgrades in cycle order. */
export function refuseCycle(data: PlanData) {
  const edges: [number, number][] = [];
  for (const u of data.upgrades) for (const p of u.prerequisiteIds) edges.push([p, u.id]);
  const cycle = findCycle(
    data.upgrades.map((u) => u.id),
    edges,
  );
  if (!cycle) return;
  const titles = cycleTitles(data, cycle);
  throw new AppError(
    422,
    'cycle',
    `Prerequisites form a cycle: ${[...titles, titles[0]].join(' → ')}. Remove one of these prerequisites first.`,
    undefined,
    { cycle: titles, cycleIds: cycle },
  );
}

/**
 * The earliest the remaining work can be done with one bay: prerequisites, the day each upgrade's
 * parts are due (an upgrade cannot start before) and the shop's hours per week (shared/planner/forecast).
 * Names the chain that sets the date and, when the bay has to wait for one, the late part behind it.
 */
export async function criticalSummary(data: PlanData, input: PlannerInput) {
  const hoursPerDay = input.shopHoursPerWeek / SHOP_DAYS_PER_WEEK;
  const r = minimumShopDays(data.upgrades, hoursPerDay);
  if (!r.ok) return null;
  const now = today(data.build.timeZone);
  const forecast = bayForecast(
    data.upgrades.map((u) => ({
      id: u.id,
      hours: u.installState === 'installed' ? 0 : u.estimatedHours,
      release: u.partsDueDate ? Math.max(0, daysBetween(now, u.partsDueDate)) : 0,
      prerequisiteIds: u.prerequisiteIds,
    })),
    input.shopHoursPerWeek,
  );
  if (!forecast.ok) return null;
  const title = new Map(data.upgrades.map((u) => [u.id, u.title]));
  const drivingPart =
    forecast.drivenByRelease === null
      ? null
      : await latePart(forecast.drivenByRelease, title.get(forecast.drivenByRelease) ?? '');
  const finishDays = Math.ceil(forecast.days - 1e-9);
  return {
    hours: r.hours,
    days: r.days,
    hoursPerDay,
    /** What sets the earliest finish: a part the bay must wait for, or the hours of work themselves. */
    limitedBy: drivingPart ? ('parts' as const) : ('hours' as const),
    critical: forecast.critical.map((id) => ({ id, title: title.get(id) ?? `#${id}` })),
    drivingPart,
    earliestFinish: addDays(now, finishDays),
  };
}

/** The part that holds an upgrade back longest: the latest expected arrival among parts not yet in. */
async function latePart(upgradeId: number, upgradeTitle: string) {
  const [row] = await sequelize.query<{ id: number; part_number: string; description: string; expected: string }>(
    `SELECT id, part_number, description, to_char(expected_arrival, 'YYYY-MM-DD') AS expected FROM parts
      WHERE upgrade_id = :upgradeId AND state NOT IN ('received','fitted','returned') AND expected_arrival IS NOT NULL
      ORDER BY expected_arrival DESC, id LIMIT 1`,
    { replacements: { upgradeId }, type: QueryTypes.SELECT },
  );
  if (!row) return null;
  return {
    upgradeId,
    upgradeTitle,
    partId: row.id,
    partNumber: row.part_number,
    description: row.description,
    expectedArrival: row.expected,
  };
}

/** What the planner screen needs: the episodes, the planner input for checking drafts, violations. */
export async function planOverview(build: Build) {
  const data = await loadPlanData(build);
  const input = plannerInput(data, capacityOf(build), false);
  const violations = validatePlan(input, currentPlan(data));
  const [version, undoable] = await Promise.all([planVersion(build.id), lastUndoable(build.id)]);
  return {
    planVersion: version,
    undo: undoable
      ? {
          number: undoable.number,
          summary: undoable.summary,
          userName: undoable.userName,
          createdAt: undoable.createdAt.toISOString(),
        }
      : null,
    episodes: data.episodes,
    upgrades: data.upgrades,
    input,
    violations,
    criticalPath: await criticalSummary(data, input),
    capacityHours: Math.min(build.shootHoursPerEpisode, (build.shopHoursPerWeek * build.releaseCadenceDays) / 7),
  };
}

export async function checkPlan(build: Build): Promise<PlanViolation[]> {
  const data = await loadPlanData(build);
  return validatePlan(plannerInput(data, capacityOf(build), false), currentPlan(data));
}

// The proposal's shapes are the contract's (shared/contracts/plan.ts): an episode's area is an Area.
export type { PlanDifference } from '../../shared/contracts/plan';

export async function propose(build: Build, over: Partial<Capacity>) {
  const data = await loadPlanData(build);
  refuseCycle(data);
  const cap = capacityOf(build, over);
  const input = plannerInput(data, cap, true);
  const plan = proposePlan(input);
  if (!plan.ok) {
    const titles = cycleTitles(data, plan.cycle);
    throw new AppError(422, 'cycle', `Prerequisites form a cycle: ${[...titles, titles[0]].join(' → ')}.`, undefined, {
      cycle: titles,
      cycleIds: plan.cycle,
    });
  }
  // Locked episodes keep their ids by number; the rest of the existing episodes are reused in
  // series order for the new ones, so their titles and records carry over.
  const byNumber = new Map(data.episodes.map((e) => [e.number, e]));
  const lockedNumbers = new Set(plan.episodes.filter((e) => e.locked).map((e) => e.number));
  const reusable = data.episodes.filter((e) => !lockedNumbers.has(e.number) && !LOCKED_STATES.includes(e.state));
  const titleOf = new Map(data.upgrades.map((u) => [u.id, u.title]));
  const episodes: ProposedEpisode[] = plan.episodes.map((e) => {
    const existing = e.locked ? byNumber.get(e.number) : reusable.shift();
    const first = titleOf.get(e.upgradeIds[0]) ?? 'New episode';
    return {
      id: existing?.id ?? null,
      number: e.number,
      title: existing?.title ?? (e.area ? `${AREA_LABELS[e.area]}: ${first}` : first),
      state: existing?.state ?? null,
      shootDate: e.shootDate,
      releaseDate: e.releaseDate,
      area: e.area,
      hours: e.hours,
      upgradeIds: e.upgradeIds,
      locked: e.locked,
      oversize: e.oversize,
    };
  });
  let next = Math.max(0, ...episodes.map((e) => e.number)) + 1;
  // Existing episodes the proposal does not need stay in the series, emptied, at the end.
  for (const e of reusable) {
    episodes.push({
      id: e.id,
      number: next++,
      title: e.title,
      state: e.state,
      shootDate: e.shootDate,
      releaseDate: e.releaseDate,
      area: null,
      hours: 0,
      upgradeIds: [],
      locked: false,
      oversize: false,
    });
  }
  const violations = validatePlan(plannerInput(data, cap, false), {
    episodes: episodes.map((e) => ({ number: e.number, shootDate: e.shootDate, upgradeIds: e.upgradeIds })),
  });
  return {
    planVersion: await planVersion(build.id),
    summary: changeSummary(data, episodes),
    proposal: {
      episodes,
      forecastFinish: plan.forecastFinish,
      buildDoneDate: plan.buildDoneDate,
      /** Which rule ordered it: priorities and votes, or longest chain first (only when that finishes earlier). */
      method: plan.method,
      capacityHours: plan.capacityHours,
      unplaced: plan.unplaced.map((id) => ({ id, title: titleOf.get(id) ?? `#${id}` })),
      violations,
    },
    current: { episodes: data.episodes, violations: validatePlan(plannerInput(data, cap, false), currentPlan(data)) },
    differences: differences(data, episodes),
  };
}

function differences(data: PlanData, proposed: ProposedEpisode[]): PlanDifference[] {
  type Where = { episodeId: number | null; key: string; number: number; position: number };
  const was = new Map<number, Where>();
  for (const e of data.episodes)
    e.upgradeIds.forEach((id, position) =>
      was.set(id, { episodeId: e.id, key: `id${e.id}`, number: e.number, position }),
    );
  const will = new Map<number, Where>();
  for (const e of proposed)
    e.upgradeIds.forEach((id, position) =>
      will.set(id, { episodeId: e.id, key: e.id ? `id${e.id}` : `new${e.number}`, number: e.number, position }),
    );
  const out: PlanDifference[] = [];
  for (const u of data.upgrades) {
    const a = was.get(u.id);
    const b = will.get(u.id);
    const strip = (w?: Where) => (w ? { episodeId: w.episodeId, number: w.number, position: w.position } : null);
    let kind: PlanDifference['kind'] | null = null;
    if (!a && b) kind = 'added';
    else if (a && !b) kind = 'removed';
    else if (a && b && a.key !== b.key) kind = 'moved';
    else if (a && b && a.position !== b.position) kind = 'reordered';
    if (kind) out.push({ upgradeId: u.id, title: u.title, kind, from: strip(a), to: strip(b) });
  }
  return out;
}
