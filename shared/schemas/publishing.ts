// Chapters, publishing and campaign payloads for an episode's show notes.
import { z } from 'zod';
import { httpUrl, id, safeString } from './common';

// Two days is far past any episode; it only keeps numbers sane before validateChapters speaks.
const seconds = z.number().int('must be whole seconds').min(0, 'cannot be negative').max(172_800, 'is too long');
const runtime = z.number().int('must be whole seconds').positive('must be more than 0').max(172_800, 'is too long');

export const chapterSchema = z.strictObject({
  startSeconds: seconds,
  title: safeString().max(200, 'must be at most 200 characters'),
  upgradeId: id.nullish().transform((v) => v ?? null),
});
export const putChaptersSchema = z.strictObject({
  chapters: z.array(chapterSchema).max(100, 'at most 100 chapters'),
  runtimeSeconds: runtime.nullish(),
});
/** Why an unfinished episode goes live anyway; without it, an unfinished episode is refused. */
export const overrideReason = z.string().trim().min(1, 'give a reason').max(1000, 'must be at most 1000 characters');
export const publishSchema = z.strictObject({
  videoUrl: httpUrl,
  runtimeSeconds: runtime.optional(),
  overrideReason: overrideReason.optional(),
});
export const campaignSchema = z.strictObject({
  campaign: z
    .string()
    .trim()
    .regex(/^[a-z0-9_-]{1,60}$/, 'use 1–60 lower-case letters, digits, - or _')
    .nullable(),
});

export type PutChaptersInput = z.infer<typeof putChaptersSchema>;
export type PublishInput = z.infer<typeof publishSchema>;
