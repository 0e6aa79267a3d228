// Contracts of the episodes routes (/api/builds/:buildId/episodes): the episode record every role
// reads (no money), the list, and the one-episode answer of create and change.
import { z } from 'zod';
import { EPISODE_STATES } from '../domain';
import { day, idNumber, timestamp, type RouteTable } from './common';

export const Episode = z.object({
  id: idNumber,
  buildId: idNumber,
  number: z.number().int().positive(),
  title: z.string(),
  summary: z.string().nullable(),
  state: z.enum(EPISODE_STATES),
  shootDate: day.nullable(),
  releaseDate: day.nullable(),
  videoUrl: z.string().nullable(),
  runtimeSeconds: z.number().int().nullable(),
  publishedAt: timestamp.nullable(),
  /** Its upgrades in running order. */
  upgradeIds: z.array(idNumber),
  version: z.number().int().min(0),
});
export type Episode = z.infer<typeof Episode>;
/** The name the rest of the code knows it by. */
export type EpisodeRecord = Episode;

export const EpisodeList = z.object({ episodes: z.array(Episode) });
export type EpisodeList = z.infer<typeof EpisodeList>;
export const EpisodeAnswer = z.object({ episode: Episode });
export type EpisodeAnswer = z.infer<typeof EpisodeAnswer>;

export const episodeRoutes = {
  'GET /api/builds/:buildId/episodes': EpisodeList,
  'POST /api/builds/:buildId/episodes': EpisodeAnswer,
  'PATCH /api/builds/:buildId/episodes/:episodeId': EpisodeAnswer,
} satisfies RouteTable;
