// Slips against the baseline, releases at risk, and the producers' notices of one build.
import { api } from './http';
import type { NoticeList, SlipReport } from '@shared/contracts/slips';

export type { EpisodeSlip, Notice, NoticeList, SlipReport } from '@shared/contracts/slips';

export const slipsApi = {
  report: (buildId: number) => api.get<SlipReport>(`/api/builds/${buildId}/slips`),
  notices: (buildId: number) => api.get<NoticeList>(`/api/builds/${buildId}/notices`),
  markSeen: (buildId: number) => api.post<NoticeList>(`/api/builds/${buildId}/notices/seen`, {}),
};
