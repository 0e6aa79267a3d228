// Episodes of one build: list, create, change (state, dates, place in the series), delete.
import type { z } from 'zod';
import { api } from './http';
import type { EpisodeAnswer, EpisodeList } from '@shared/contracts/episode';
import type { createEpisodeSchema, updateEpisodeSchema } from '@shared/schemas/episode';

/** The change a form sends (shared/schemas/episode.ts updateEpisodeSchema). */
export type EpisodeChange = z.input<typeof updateEpisodeSchema>;

const base = (buildId: number) => `/api/builds/${buildId}/episodes`;

export const episodesApi = {
  list: (buildId: number) => api.get<EpisodeList>(base(buildId)),
  create: (buildId: number, body: z.input<typeof createEpisodeSchema>) => api.post<EpisodeAnswer>(base(buildId), body),
  update: (buildId: number, id: number, body: EpisodeChange) =>
    api.patch<EpisodeAnswer>(`${base(buildId)}/${id}`, body),
  remove: (buildId: number, id: number) => api.del<void>(`${base(buildId)}/${id}`),
};
