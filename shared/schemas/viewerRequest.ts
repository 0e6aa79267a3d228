// Viewer requests and votes from the public page, and marketing's triage of them.
import { z } from 'zod';
import { AREAS, REQUEST_STATES } from '../domain';
import { email, hours, id, optionalText, requiredText, safeString } from './common';

/** Left empty by people; bots that fill every field fill it. */
const website = safeString().max(500, 'must be at most 500 characters').optional();
const name = optionalText(80);

export const publicRequestSchema = z.strictObject({
  title: requiredText(140).min(3, 'must be at least 3 characters'),
  details: optionalText(2000),
  name,
  email,
  website,
});
export const publicVoteSchema = z.strictObject({ name, email, website });

export const viewerRequestQuery = z.object({ state: z.enum(REQUEST_STATES).optional() });

export const triageSchema = z
  .strictObject({
    action: z.enum(['accept', 'merge', 'decline']),
    upgradeId: id.optional(),
    newUpgrade: z
      .strictObject({ title: requiredText(140), area: z.enum(AREAS), estimatedHours: hours.optional() })
      .optional(),
    intoId: id.optional(),
    reason: requiredText(500).optional(),
    /** The request's version when it was read; a request changed since answers 409. */
    version: z.number().int().min(0),
  })
  .superRefine((v, ctx) => {
    const need = (path: string, message: string) => ctx.addIssue({ code: 'custom', path: [path], message });
    if (v.action === 'accept' && !!v.upgradeId === !!v.newUpgrade)
      need('upgradeId', 'give either upgradeId (link an upgrade) or newUpgrade (create one)');
    if (v.action === 'merge' && !v.intoId) need('intoId', 'is required to merge');
    if (v.action === 'decline' && !v.reason) need('reason', 'is required to decline');
  });

export type PublicRequestInput = z.infer<typeof publicRequestSchema>;
export type PublicVoteInput = z.infer<typeof publicVoteSchema>;
export type TriageInput = z.infer<typeof triageSchema>;
