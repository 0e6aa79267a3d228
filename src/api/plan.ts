// The episode plan of one build: the planner's data, proposals, applying a plan, the calendar URL.
import { api } from './http';
import type { Area, EpisodeRecord, EpisodeState, InstallState } from '@shared/domain';
import type { PlannerInput, PlanViolation } from '@shared/planner/index';
import type { PlanChangeSummary } from '@shared/planChange';

export interface PlanUpgrade {
  id: number;
  title: string;
  area: Area;
  estimatedHours: number;
  priority: number;
  installState: InstallState;
  episodeId: number | null;
  episodePosition: number | null;
  partsDueDate: string | null;
  /** Parts still to come without an expected arrival (the planner cannot wait for them). */
  partsUndated: number;
  prerequisiteIds: number[];
}

export interface CriticalSummary {
  hours: number;
  days: number;
  hoursPerDay: number;
  /** What sets the earliest finish: a part the bay must wait for, or the hours of work themselves. */
  limitedBy: 'parts' | 'hours';
  critical: { id: number; title: string }[];
  /** The late part that opens the last stretch of work, when there is one. */
  drivingPart: { upgradeId: number; upgradeTitle: string; partId: number; partNumber: string; description: string; expectedArrival: string } | null;
  earliestFinish: string;
}

export interface PlanOverview {
  /** The plan version changes are made from (PUT and undo send it back as basedOn). */
  planVersion: number;
  /** The applied change "Undo" would take back, if any. */
  undo: { number: number; summary: string; userName: string | null; createdAt: string } | null;
  episodes: EpisodeRecord[];
  upgrades: PlanUpgrade[];
  input: PlannerInput;
  violations: PlanViolation[];
  criticalPath: CriticalSummary | null;
  capacityHours: number;
}

export interface ProposedEpisode {
  id: number | null;
  number: number;
  title: string;
  state: EpisodeState | null;
  shootDate: string | null;
  releaseDate: string | null;
  area: Area | null;
  hours: number;
  upgradeIds: number[];
  locked: boolean;
  oversize: boolean;
}

export interface PlanDifference {
  upgradeId: number;
  title: string;
  kind: 'moved' | 'reordered' | 'added' | 'removed';
  from: { episodeId: number | null; number: number; position: number } | null;
  to: { episodeId: number | null; number: number; position: number } | null;
}

export interface ProposalAnswer {
  planVersion: number;
  summary: PlanChangeSummary;
  proposal: {
    episodes: ProposedEpisode[];
    forecastFinish: string | null;
    buildDoneDate: string | null;
    /** Which rule ordered the proposal: priorities and votes, or longest chain first (when that finishes earlier). */
    method?: 'priority' | 'chain';
    capacityHours: number;
    unplaced: { id: number; title: string }[];
    violations: PlanViolation[];
  };
  current: { episodes: EpisodeRecord[]; violations: PlanViolation[] };
  differences: PlanDifference[];
}

export interface PlanBodyEpisode {
  id?: number;
  title?: string;
  shootDate?: string | null;
  releaseDate?: string | null;
  upgradeIds: number[];
}

const base = (buildId: number) => `/api/builds/${buildId}/plan`;

export const planApi = {
  overview: (buildId: number) => api.get<PlanOverview>(base(buildId)),
  check: (buildId: number) => api.get<{ violations: PlanViolation[] }>(`${base(buildId)}/check`),
  propose: (buildId: number, capacity: { shootHoursPerEpisode?: number; shopHoursPerWeek?: number; releaseCadenceDays?: number } = {}) =>
    api.post<ProposalAnswer>(`${base(buildId)}/proposal`, capacity),
  apply: (buildId: number, episodes: PlanBodyEpisode[], basedOn: number, acceptDateChanges?: number[]) =>
    api.put<{ episodes: EpisodeRecord[]; violations: PlanViolation[]; planVersion: number }>(base(buildId), { episodes, basedOn, ...(acceptDateChanges ? { acceptDateChanges } : {}) }),
  undo: (buildId: number, basedOn: number) =>
    api.post<{ episodes: EpisodeRecord[]; planVersion: number; undone: { number: number; summary: string } }>(`${base(buildId)}/undo`, { basedOn }),
};

export const calendarApi = {
  get: (buildId: number) => api.get<{ url: string }>(`/api/builds/${buildId}/calendar`),
  rotate: (buildId: number) => api.post<{ url: string }>(`/api/builds/${buildId}/calendar/rotate`, {}),
};
