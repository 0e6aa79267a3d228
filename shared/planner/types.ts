// Input and output shapes of the episode planner (proposePlan, validatePlan).
import type { Area, InstallState } from '../domain';

export interface PlannerUpgrade {
  id: number;
  title: string;
  area: Area;
  estimatedHours: number;
  /** 1 is the most urgent, 5 the least. */
  priority: number;
  /** Confirmed viewer votes for this upgrade. */
  votes: number;
  installState: InstallState;
  /** Latest expected arrival among its parts not yet received; null when every part is in. */
  partsDueDate: string | null;
  prerequisiteIds: number[];
  /** The episode it is locked into (installed, or its episode is shot or live); null when free. */
  fixedEpisode?: number | null;
}

export interface FixedEpisode {
  number: number;
  shootDate: string | null;
  releaseDate: string | null;
  upgradeIds: number[];
}

export interface PlannerInput {
  startDate: string;
  shootHoursPerEpisode: number;
  releaseCadenceDays: number;
  shopHoursPerWeek: number;
  upgrades: PlannerUpgrade[];
  fixedEpisodes?: FixedEpisode[];
}

export interface PlanEpisode {
  number: number;
  shootDate: string;
  releaseDate: string;
  /** The area with the most hours in the episode (ties: the first such area in running order). */
  area: Area | null;
  hours: number;
  /** Upgrades in running order. */
  upgradeIds: number[];
  /** Kept as given (a fixed episode or one an upgrade is locked into); the planner adds nothing. */
  locked: boolean;
  /** A single upgrade larger than one episode's capacity, given an episode of its own. */
  oversize: boolean;
}

/**
 * Which rule ordered the proposal: `priority` (priority, votes, id, with prerequisites inheriting
 * urgency) or `chain` (longest chain of work first, chosen only when it finishes strictly earlier).
 */
export type PlanMethod = 'priority' | 'chain';

export type Plan =
  | {
      ok: true;
      method: PlanMethod;
      episodes: PlanEpisode[];
      /** Release date of the last episode: the day the whole series is live. Null with no episodes. */
      forecastFinish: string | null;
      /** Shoot date of the last episode: the day the build is installed and filmed. */
      buildDoneDate: string | null;
      /** Hours one new episode may hold: min(shoot hours per episode, shop hours per cadence). */
      capacityHours: number;
      /** Upgrades it could not place: estimated hours not a finite number ≥ 0, or a prerequisite that is unplaced. */
      unplaced: number[];
    }
  | { ok: false; cycle: number[] };

/** What validatePlan needs of a plan, so a hand-made order can be checked too. */
export interface PlanToValidate {
  episodes: { number: number; shootDate?: string | null; upgradeIds: number[] }[];
}

export const VIOLATION_KINDS = [
  'prerequisite_order',
  'parts_late',
  'over_capacity',
  'unknown_upgrade',
  'duplicate_upgrade',
  'cycle',
] as const;
export type ViolationKind = (typeof VIOLATION_KINDS)[number];

export interface PlanViolation {
  kind: ViolationKind;
  message: string;
  upgradeIds: number[];
  episodeNumbers: number[];
}
