// Slips against the baseline, releases at risk, and the producers' notices of one build.
import { api } from './http';
import type { EpisodeSlip } from '@shared/planner/slips';

export type { EpisodeSlip };

export interface SlipReport {
  today: string;
  episodes: EpisodeSlip[];
  atRisk: number[];
}

export interface Notice {
  id: number;
  kind: 'release_at_risk' | 'part_overdue' | 'part_later';
  message: string;
  data: Record<string, unknown>;
  createdAt: string;
  unread: boolean;
}

export interface NoticeList {
  notices: Notice[];
  unread: number;
}

export const slipsApi = {
  report: (buildId: number) => api.get<SlipReport>(`/api/builds/${buildId}/slips`),
  notices: (buildId: number) => api.get<NoticeList>(`/api/builds/${buildId}/notices`),
  markSeen: (buildId: number) => api.post<NoticeList>(`/api/builds/${buildId}/notices/seen`, {}),
};
