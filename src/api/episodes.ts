// Episodes of one build: list, create, change (state, dates, place in the series), delete.
import { api } from './http';
import type { EpisodeRecord, EpisodeState } from '@shared/domain';

export interface EpisodeChange {
  title?: string;
  summary?: string | null;
  state?: EpisodeState;
  shootDate?: string | null;
  releaseDate?: string | null;
  videoUrl?: string | null;
  runtimeSeconds?: number | null;
  number?: number;
  version: number;
}

const base = (buildId: number) => `/api/builds/${buildId}/episodes`;

export const episodesApi = {
  list: (buildId: number) => api.get<{ episodes: EpisodeRecord[] }>(base(buildId)),
  create: (buildId: number, body: { title: string; shootDate?: string | null; releaseDate?: string | null; number?: number }) =>
    api.post<{ episode: EpisodeRecord }>(base(buildId), body),
  update: (buildId: number, id: number, body: EpisodeChange) => api.patch<{ episode: EpisodeRecord }>(`${base(buildId)}/${id}`, body),
  remove: (buildId: number, id: number) => api.del<void>(`${base(buildId)}/${id}`),
};
