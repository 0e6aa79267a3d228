// Viewer requests as staff triage them (marketing, producer, owner).
import { z } from 'zod';
import { REQUEST_STATES } from '../domain';
import { idNumber, timestamp, type RouteTable } from './common';

export const StaffRequest = z.object({
  id: idNumber,
  title: z.string(),
  details: z.string().nullable(),
  state: z.enum(REQUEST_STATES),
  votes: z.number().int(),
  pendingVotes: z.number().int(),
  confirmed: z.boolean(),
  upgradeId: idNumber.nullable(),
  upgradeTitle: z.string().nullable(),
  mergedIntoId: idNumber.nullable(),
  mergedIntoTitle: z.string().nullable(),
  declineReason: z.string().nullable(),
  createdAt: timestamp,
  /** Sent back with a triage: a request changed since answers 409. */
  version: z.number().int(),
});
export type StaffRequest = z.infer<typeof StaffRequest>;

/** The requests, and confirmed votes per accepted upgrade (keys are upgrade ids). */
export const StaffRequestList = z.object({
  requests: z.array(StaffRequest),
  votesByUpgrade: z.record(z.string(), z.number().int()),
});
export type StaffRequestList = z.infer<typeof StaffRequestList>;
export const StaffRequestAnswer = z.object({ request: StaffRequest });
export type StaffRequestAnswer = z.infer<typeof StaffRequestAnswer>;

export const viewerRequestRoutes = {
  'GET /api/builds/:buildId/viewer-requests': StaffRequestList,
  'PATCH /api/builds/:buildId/viewer-requests/:requestId': StaffRequestAnswer,
} satisfies RouteTable;
