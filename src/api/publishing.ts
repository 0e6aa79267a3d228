// Chapters, show notes, publishing, product-link health and the campaign name of a build.
import { api } from './http';
import type { ChapterRecord, EpisodeRecord } from '@shared/domain';
import type { UnfinishedUpgrade } from '@shared/episodeReadiness';

export interface LinkHealthPart {
  id: number;
  partNumber: string;
  description: string;
  condition: string;
  version: number;
  upgradeId: number;
  upgradeTitle: string;
  episodeId: number;
  episodeNumber: number;
  episodeTitle: string;
  episodeState: string;
}

const ep = (buildId: number, episodeId: number) => `/api/builds/${buildId}/episodes/${episodeId}`;

export const publishingApi = {
  chapters: (buildId: number, episodeId: number) =>
    api.get<{ chapters: ChapterRecord[]; runtimeSeconds: number | null; episode: EpisodeRecord }>(`${ep(buildId, episodeId)}/chapters`),
  saveChapters: (buildId: number, episodeId: number, body: { chapters: ChapterRecord[]; runtimeSeconds?: number | null }) =>
    api.put<{ chapters: ChapterRecord[]; runtimeSeconds: number | null }>(`${ep(buildId, episodeId)}/chapters`, body),
  showNotes: (buildId: number, episodeId: number) => api.get<{ text: string; problems: string[] }>(`${ep(buildId, episodeId)}/show-notes`),
  readiness: (buildId: number, episodeId: number) => api.get<{ ready: boolean; unfinished: UnfinishedUpgrade[] }>(`${ep(buildId, episodeId)}/readiness`),
  publish: (buildId: number, episodeId: number, body: { videoUrl: string; runtimeSeconds?: number; overrideReason?: string }) =>
    api.post<{ episode: EpisodeRecord }>(`${ep(buildId, episodeId)}/publish`, body),
  linkHealth: (buildId: number) => api.get<{ parts: LinkHealthPart[] }>(`/api/builds/${buildId}/link-health`),
  campaign: (buildId: number) => api.get<{ campaign: string | null; effective: string; publicPageUrl: string | null }>(`/api/builds/${buildId}/campaign`),
  setCampaign: (buildId: number, campaign: string | null) =>
    api.put<{ campaign: string | null; effective: string; publicPageUrl: string | null }>(`/api/builds/${buildId}/campaign`, { campaign }),
};
