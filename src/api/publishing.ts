// Chapters, show notes, publishing, product-link health and the campaign name of a build.
import type { z } from 'zod';
import { api } from './http';
import type { EpisodeAnswer } from '@shared/contracts/episode';
import type {
  Campaign,
  ChaptersAnswer,
  ChaptersSaved,
  LinkHealth,
  Readiness,
  ShowNotesAnswer,
} from '@shared/contracts/publishing';
import type { publishSchema, putChaptersSchema } from '@shared/schemas/publishing';

export type { LinkHealthPart } from '@shared/contracts/publishing';

const ep = (buildId: number, episodeId: number) => `/api/builds/${buildId}/episodes/${episodeId}`;

export const publishingApi = {
  chapters: (buildId: number, episodeId: number) => api.get<ChaptersAnswer>(`${ep(buildId, episodeId)}/chapters`),
  saveChapters: (buildId: number, episodeId: number, body: z.input<typeof putChaptersSchema>) =>
    api.put<ChaptersSaved>(`${ep(buildId, episodeId)}/chapters`, body),
  showNotes: (buildId: number, episodeId: number) => api.get<ShowNotesAnswer>(`${ep(buildId, episodeId)}/show-notes`),
  readiness: (buildId: number, episodeId: number) => api.get<Readiness>(`${ep(buildId, episodeId)}/readiness`),
  publish: (buildId: number, episodeId: number, body: z.input<typeof publishSchema>) =>
    api.post<EpisodeAnswer>(`${ep(buildId, episodeId)}/publish`, body),
  linkHealth: (buildId: number) => api.get<LinkHealth>(`/api/builds/${buildId}/link-health`),
  campaign: (buildId: number) => api.get<Campaign>(`/api/builds/${buildId}/campaign`),
  setCampaign: (buildId: number, campaign: string | null) =>
    api.put<Campaign>(`/api/builds/${buildId}/campaign`, { campaign }),
};
