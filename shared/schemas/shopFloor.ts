// Shop-floor payloads: stepping back a mark (with the version it was made from, and a reason once
// the mark is more than a few minutes old).
import { z } from 'zod';
import { text } from './common';

export const STEP_BACK_MARKS = ['installState', 'installSegment', 'demoSegment'] as const;

export const stepBackSchema = z.strictObject({
  mark: z.enum(STEP_BACK_MARKS, 'choose install state, install segment or demo segment'),
  version: z.number().int().min(0),
  reason: text(500)
    .optional()
    .transform((v) => (v ? v : undefined)),
});

export type StepBackInput = z.infer<typeof stepBackSchema>;
