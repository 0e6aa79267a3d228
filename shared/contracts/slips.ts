// Contracts of slips against the baseline (/api/builds/:buildId/slips) and the producers' notices
// (/api/builds/:buildId/notices). Producer and owner; no money.
import { z } from 'zod';
import { day, idNumber, timestamp, type RouteTable } from './common';

const dates = z.object({ shootDate: day.nullable(), releaseDate: day.nullable() });

export const LatePart = z.object({
  partId: idNumber,
  partNumber: z.string(),
  description: z.string(),
  upgradeId: idNumber,
  upgradeTitle: z.string(),
  expectedArrival: day,
  overdue: z.boolean(),
});

/** One episode's baseline, plan and projection (shared/planner/slips.ts). */
export const EpisodeSlip = z.object({
  episodeId: idNumber,
  number: z.number().int(),
  title: z.string(),
  /** The episode's state (shared/domain EPISODE_STATES). */
  state: z.string(),
  baseline: dates,
  planned: dates,
  projected: dates,
  partsDelayDays: z.number().int().min(0),
  slipDays: z.object({ shoot: z.number().int().nullable(), release: z.number().int().nullable() }),
  releaseAtRisk: z.boolean(),
  cause: LatePart.nullable(),
});
export type EpisodeSlip = z.infer<typeof EpisodeSlip>;

export const SlipReport = z.object({ today: day, episodes: z.array(EpisodeSlip), atRisk: z.array(idNumber) });
export type SlipReport = z.infer<typeof SlipReport>;

export const Notice = z.object({
  id: idNumber,
  kind: z.enum(['release_at_risk', 'part_overdue', 'part_later']),
  message: z.string(),
  data: z.record(z.string(), z.unknown()),
  createdAt: timestamp,
  unread: z.boolean(),
});
export type Notice = z.infer<typeof Notice>;

export const NoticeList = z.object({ notices: z.array(Notice), unread: z.number().int().min(0) });
export type NoticeList = z.infer<typeof NoticeList>;

export const slipRoutes = {
  'GET /api/builds/:buildId/slips': SlipReport,
  'GET /api/builds/:buildId/notices': NoticeList,
  'POST /api/builds/:buildId/notices/seen': NoticeList,
} satisfies RouteTable;
