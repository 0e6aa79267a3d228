// Reads a build's upgrades, prerequisites, parts dates, votes and episodes into the shapes the
// pure planner (shared/planner) takes, so proposal, check and apply all see the same facts.
import { QueryTypes, type Transaction } from 'sequelize';
import { sequelize, Episode, type Build } from '../models';
import { votesByUpgrade } from './votes';
import { LOCKED_STATES, toRecord, upgradeIdsByEpisode } from './episodes';
import type { Area, EpisodeRecord, InstallState } from '../../shared/domain';
import type { PlannerInput, PlannerUpgrade, PlanToValidate } from '../../shared/planner/index';
import { addDays, todayIn } from '../../shared/dates';

export interface UpgradeRow {
  id: number;
  title: string;
  area: Area;
  estimatedHours: number;
  priority: number;
  installState: InstallState;
  episodeId: number | null;
  episodePosition: number | null;
  partsDueDate: string | null;
  /** Parts still to come with no expected arrival yet: the planner cannot hold the upgrade back for them. */
  partsUndated: number;
  prerequisiteIds: number[];
}

export interface PlanData {
  build: Build;
  upgrades: UpgradeRow[];
  episodes: EpisodeRecord[];
  votes: Record<number, number>;
}

/** Today as an ISO date in the build's zone (UTC when none is given), the earliest day a new shoot can be planned for. */
export const today = (zone?: string | null) => todayIn(zone);

export async function loadPlanData(build: Build, t?: Transaction): Promise<PlanData> {
  const replacements = { buildId: build.id };
  const [rows, edges, eps, ids, votes] = await Promise.all([
    sequelize.query<{
      id: number;
      title: string;
      area: Area;
      estimated_hours: number;
      priority: number;
      install_state: InstallState;
      episode_id: number | null;
      episode_position: number | null;
      parts_due: string | null;
      parts_undated: number;
    }>(
      // Parts not yet in hand (not received, fitted or returned) decide when an upgrade can be shot.
      `SELECT u.id, u.title, u.area, u.estimated_hours, u.priority, u.install_state, u.episode_id, u.episode_position,
              (SELECT to_char(max(p.expected_arrival), 'YYYY-MM-DD') FROM parts p
                WHERE p.upgrade_id = u.id AND p.state NOT IN ('received','fitted','returned')) AS parts_due,
              (SELECT count(*)::int FROM parts p
                WHERE p.upgrade_id = u.id AND p.state NOT IN ('received','fitted','returned') AND p.expected_arrival IS NULL) AS parts_undated
         FROM upgrades u WHERE u.build_id = :buildId ORDER BY u.id`,
      { replacements, type: QueryTypes.SELECT, transaction: t },
    ),
    sequelize.query<{ upgrade_id: number; prerequisite_id: number }>(
      'SELECT upgrade_id, prerequisite_id FROM upgrade_prerequisites WHERE build_id = :buildId ORDER BY upgrade_id, prerequisite_id',
      { replacements, type: QueryTypes.SELECT, transaction: t },
    ),
    Episode.findAll({ where: { buildId: build.id }, order: [['number', 'ASC']], transaction: t }),
    upgradeIdsByEpisode(build.id, t),
    votesByUpgrade(build.id),
  ]);
  const prereqs = new Map<number, number[]>();
  for (const e of edges) {
    if (!prereqs.has(e.upgrade_id)) prereqs.set(e.upgrade_id, []);
    prereqs.get(e.upgrade_id)!.push(e.prerequisite_id);
  }
  return {
    build,
    votes,
    episodes: eps.map((e) => toRecord(e, ids.get(e.id) ?? [])),
    upgrades: rows.map((r) => ({
      id: r.id,
      title: r.title,
      area: r.area,
      estimatedHours: Number(r.estimated_hours),
      priority: r.priority,
      installState: r.install_state,
      episodeId: r.episode_id,
      episodePosition: r.episode_position,
      partsDueDate: r.parts_due,
      partsUndated: r.parts_undated,
      prerequisiteIds: prereqs.get(r.id) ?? [],
    })),
  };
}

export interface Capacity {
  startDate: string;
  shootHoursPerEpisode: number;
  releaseCadenceDays: number;
  shopHoursPerWeek: number;
}

export function capacityOf(build: Build, over: Partial<Capacity> = {}): Capacity {
  return {
    startDate: over.startDate ?? build.startDate,
    shootHoursPerEpisode: over.shootHoursPerEpisode ?? build.shootHoursPerEpisode,
    releaseCadenceDays: over.releaseCadenceDays ?? build.releaseCadenceDays,
    shopHoursPerWeek: over.shopHoursPerWeek ?? build.shopHoursPerWeek,
  };
}

const isLocked = (ep: EpisodeRecord) => LOCKED_STATES.includes(ep.state);

/**
 * The planner's input. Locked: episodes already shot, in edit or live (kept with their dates and
 * running order), and installed upgrades in any episode. `forProposal` leaves out installed
 * upgrades that are in no episode (done outside the series; nothing to plan), which validation keeps
 * so that a dependant of one is not flagged.
 */
export function plannerInput(data: PlanData, cap: Capacity, forProposal: boolean): PlannerInput {
  const epById = new Map(data.episodes.map((e) => [e.id, e]));
  const upgrades: PlannerUpgrade[] = [];
  for (const u of data.upgrades) {
    const ep = u.episodeId ? epById.get(u.episodeId) : undefined;
    if (forProposal && !ep && u.installState === 'installed') continue;
    const locked = ep && (isLocked(ep) || u.installState === 'installed');
    upgrades.push({
      id: u.id,
      title: u.title,
      area: u.area,
      estimatedHours: u.estimatedHours,
      priority: u.priority,
      votes: data.votes[u.id] ?? 0,
      installState: u.installState,
      partsDueDate: u.partsDueDate,
      prerequisiteIds: u.prerequisiteIds,
      fixedEpisode: locked ? ep!.number : null,
    });
  }
  const byId = new Map(data.upgrades.map((u) => [u.id, u]));
  const fixedEpisodes = data.episodes
    .filter((e) => isLocked(e) || e.upgradeIds.some((id) => byId.get(id)?.installState === 'installed'))
    .map((e) => ({
      number: e.number,
      shootDate: e.shootDate,
      releaseDate: e.releaseDate,
      upgradeIds: isLocked(e) ? e.upgradeIds : e.upgradeIds.filter((id) => byId.get(id)?.installState === 'installed'),
    }));
  // New episodes are shot on the grid startDate + k × cadence. Never plan a shoot in the past:
  // move the grid so the first free slot after the locked episodes falls one cadence from today.
  const lastNumber = Math.max(0, ...fixedEpisodes.map((e) => e.number), ...upgrades.map((u) => u.fixedEpisode ?? 0));
  const shifted = addDays(today(data.build.timeZone), -lastNumber * cap.releaseCadenceDays);
  const startDate = shifted > cap.startDate ? shifted : cap.startDate;
  return { ...cap, startDate, upgrades, fixedEpisodes };
}

/** The plan as it stands in the database, for validatePlan. */
export function currentPlan(data: PlanData): PlanToValidate {
  return {
    episodes: data.episodes.map((e) => ({ number: e.number, shootDate: e.shootDate, upgradeIds: e.upgradeIds })),
  };
}
