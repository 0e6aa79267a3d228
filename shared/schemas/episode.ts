// Episode, plan and proposal payloads, shared by the server routes and the planner screen's forms.
import { z } from 'zod';
import { EPISODE_STATES } from '../domain';
import { httpUrl, id, isoDate, optionalText, requiredText } from './common';

const episodeState = z.enum(EPISODE_STATES);
const nullableDate = isoDate.nullable();
const runtime = z.number().int('must be whole seconds').positive('must be more than 0').max(86_400, 'is too long');

/** Release after shoot: reported on releaseDate so the form can put the message beside that field. */
function datesInOrder(v: { shootDate?: string | null; releaseDate?: string | null }, ctx: z.RefinementCtx) {
  if (v.shootDate && v.releaseDate && v.releaseDate < v.shootDate) {
    ctx.addIssue({ code: 'custom', path: ['releaseDate'], message: 'must be on or after the shoot date' });
  }
}

export const createEpisodeSchema = z
  .strictObject({
    title: requiredText(140),
    summary: optionalText(4000).optional(),
    shootDate: nullableDate.optional(),
    releaseDate: nullableDate.optional(),
    /** Where to put it in the series; the others move up. Default: last. */
    number: z.number().int().positive('must be 1 or more').optional(),
  })
  .superRefine(datesInOrder);

export const updateEpisodeSchema = z
  .strictObject({
    title: requiredText(140).optional(),
    summary: optionalText(4000).optional(),
    state: episodeState.optional(),
    shootDate: nullableDate.optional(),
    releaseDate: nullableDate.optional(),
    videoUrl: httpUrl.nullable().optional(),
    runtimeSeconds: runtime.nullable().optional(),
    /** A new place in the series; the episodes in between are renumbered. */
    number: z.number().int().positive('must be 1 or more').optional(),
    /** Why an unfinished episode goes live anyway (same rule as the publishing route). */
    overrideReason: z.string().trim().min(1, 'give a reason').max(1000, 'must be at most 1000 characters').optional(),
    version: z.number().int().min(0),
  })
  .superRefine(datesInOrder);

const planEpisode = z
  .strictObject({
    /** An existing episode of this build; absent for a new one (an accepted proposal may add episodes). */
    id: id.optional(),
    title: requiredText(140).optional(),
    shootDate: nullableDate.optional(),
    releaseDate: nullableDate.optional(),
    upgradeIds: z.array(id).max(5000),
  })
  .superRefine(datesInOrder);

/** The whole series in order: episode i of the list becomes number i + 1. */
export const planSchema = z.strictObject({
  episodes: z.array(planEpisode).max(1000),
  /** The plan version the change was made from; a newer plan on the server answers 409. */
  basedOn: z.number().int().min(0),
  /** Scheduled (or later) episodes whose date changes the producer saw listed and accepts. */
  acceptDateChanges: z.array(id).max(1000).optional(),
});
export const undoPlanSchema = z.strictObject({ basedOn: z.number().int().min(0) });

const positiveHours = z.number().positive('must be more than 0').max(1000, 'is too large');

/** Optional what-if capacity for a proposal; by default the build's own figures are used. */
export const proposalSchema = z.strictObject({
  shootHoursPerEpisode: positiveHours.optional(),
  shopHoursPerWeek: z.number().positive('must be more than 0').max(168, 'is more hours than a week has').optional(),
  releaseCadenceDays: z.number().int('must be whole days').min(1, 'must be 1 or more').max(365).optional(),
  startDate: isoDate.optional(),
});

export const episodeParams = z.object({ episodeId: id });

export type CreateEpisodeInput = z.infer<typeof createEpisodeSchema>;
export type UpdateEpisodeInput = z.infer<typeof updateEpisodeSchema>;
export type PlanInputBody = z.infer<typeof planSchema>;
export type ProposalBody = z.infer<typeof proposalSchema>;

/** The state order: a move to an earlier state is backward (only producers and owners may). */
export function stateRank(state: (typeof EPISODE_STATES)[number]): number {
  return EPISODE_STATES.indexOf(state);
}
