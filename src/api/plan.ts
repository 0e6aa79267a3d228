// The episode plan of one build: the planner's data, proposals, applying a plan, the calendar URL.
import type { z } from 'zod';
import { api } from './http';
import type { PlanApplied, PlanCheck, PlanOverview, PlanUndone, ProposalAnswer } from '@shared/contracts/plan';
import type { CalendarAddress } from '@shared/contracts/calendar';
import type { planSchema, proposalSchema } from '@shared/schemas/episode';

export type {
  CriticalSummary,
  PlanDifference,
  PlanOverview,
  PlanUpgrade,
  ProposalAnswer,
  ProposedEpisode,
} from '@shared/contracts/plan';

/** One episode of a plan the producer applies (shared/schemas/episode.ts planSchema). */
export type PlanBodyEpisode = z.input<typeof planSchema>['episodes'][number];

const base = (buildId: number) => `/api/builds/${buildId}/plan`;

export const planApi = {
  overview: (buildId: number) => api.get<PlanOverview>(base(buildId)),
  check: (buildId: number) => api.get<PlanCheck>(`${base(buildId)}/check`),
  propose: (buildId: number, capacity: z.input<typeof proposalSchema> = {}) =>
    api.post<ProposalAnswer>(`${base(buildId)}/proposal`, capacity),
  apply: (buildId: number, episodes: PlanBodyEpisode[], basedOn: number, acceptDateChanges?: number[]) =>
    api.put<PlanApplied>(base(buildId), { episodes, basedOn, ...(acceptDateChanges ? { acceptDateChanges } : {}) }),
  undo: (buildId: number, basedOn: number) => api.post<PlanUndone>(`${base(buildId)}/undo`, { basedOn }),
};

export const calendarApi = {
  get: (buildId: number) => api.get<CalendarAddress>(`/api/builds/${buildId}/calendar`),
  rotate: (buildId: number) => api.post<CalendarAddress>(`/api/builds/${buildId}/calendar/rotate`, {}),
};
