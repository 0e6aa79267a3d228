// Contracts of publishing (chapters, show notes, readiness, going live of one episode), product-link
// health and the build's campaign name. No money in any of them.
import { z } from 'zod';
import { EPISODE_STATES, PART_CONDITIONS } from '../domain';
import { idNumber, type RouteTable } from './common';
import { Episode, EpisodeAnswer } from './episode';

export const Chapter = z.object({
  id: idNumber,
  startSeconds: z.number().int().min(0),
  title: z.string(),
  upgradeId: idNumber.nullable(),
});
export type Chapter = z.infer<typeof Chapter>;

export const ChaptersSaved = z.object({ chapters: z.array(Chapter), runtimeSeconds: z.number().int().nullable() });
export type ChaptersSaved = z.infer<typeof ChaptersSaved>;
export const ChaptersAnswer = ChaptersSaved.extend({ episode: Episode });
export type ChaptersAnswer = z.infer<typeof ChaptersAnswer>;

/** The generated show notes, and what to fix before publishing (shared/showNotes.ts). */
export const ShowNotesAnswer = z.object({ text: z.string(), problems: z.array(z.string()) });
export type ShowNotesAnswer = z.infer<typeof ShowNotesAnswer>;

/** What stands between an episode and going live (shared/episodeReadiness.ts). */
export const Readiness = z.object({
  ready: z.boolean(),
  unfinished: z.array(z.object({ id: idNumber, title: z.string(), lacks: z.array(z.string()) })),
});
export type Readiness = z.infer<typeof Readiness>;

/** A part shown in an episode whose product page link is missing. */
export const LinkHealthPart = z.object({
  id: idNumber,
  partNumber: z.string(),
  description: z.string(),
  condition: z.enum(PART_CONDITIONS),
  version: z.number().int().min(0),
  upgradeId: idNumber,
  upgradeTitle: z.string(),
  episodeId: idNumber,
  episodeNumber: z.number().int(),
  episodeTitle: z.string(),
  episodeState: z.enum(EPISODE_STATES),
});
export type LinkHealthPart = z.infer<typeof LinkHealthPart>;
export const LinkHealth = z.object({ parts: z.array(LinkHealthPart) });
export type LinkHealth = z.infer<typeof LinkHealth>;

/** The campaign links are tagged with: the build's own, or its slug (effective) when none is set. */
export const Campaign = z.object({
  campaign: z.string().nullable(),
  effective: z.string(),
  publicPageUrl: z.string().nullable(),
});
export type Campaign = z.infer<typeof Campaign>;

export const publishingRoutes = {
  'GET /api/builds/:buildId/episodes/:episodeId/chapters': ChaptersAnswer,
  'PUT /api/builds/:buildId/episodes/:episodeId/chapters': ChaptersSaved,
  'GET /api/builds/:buildId/episodes/:episodeId/show-notes': ShowNotesAnswer,
  'GET /api/builds/:buildId/episodes/:episodeId/readiness': Readiness,
  'POST /api/builds/:buildId/episodes/:episodeId/publish': EpisodeAnswer,
  'GET /api/builds/:buildId/link-health': LinkHealth,
  'GET /api/builds/:buildId/campaign': Campaign,
  'PUT /api/builds/:buildId/campaign': Campaign,
} satisfies RouteTable;
