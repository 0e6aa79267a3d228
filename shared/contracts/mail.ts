// Outgoing mail that could not be sent (owner only).
import { z } from 'zod';
import { idNumber, OkAnswer, timestamp, type RouteTable } from './common';

export const FailedMail = z.object({
  id: idNumber,
  kind: z.string(),
  /** The address, masked once the mail's kind scrubs it, or "(removed)". */
  to: z.string(),
  subject: z.string(),
  attempts: z.number().int(),
  lastError: z.string().nullable(),
  createdAt: timestamp,
});
export type FailedMail = z.infer<typeof FailedMail>;
export const FailedMailList = z.object({ mails: z.array(FailedMail) });
export type FailedMailList = z.infer<typeof FailedMailList>;

export const mailRoutes = {
  'GET /api/mail/failed': FailedMailList,
  'POST /api/mail/:mailId/resend': OkAnswer,
} satisfies RouteTable;
