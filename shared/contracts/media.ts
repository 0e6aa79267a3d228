// Media of a build (invoices — documents on a part — reach money roles only: the service leaves
// them out of the others' lists and answers 404 for them).
import { z } from 'zod';
import { MEDIA_KINDS, MEDIA_STAGES } from '../domain';
import { idNumber, timestamp, type RouteTable } from './common';

export const MediaRecord = z.object({
  id: idNumber,
  buildId: idNumber,
  upgradeId: idNumber.nullable(),
  episodeId: idNumber.nullable(),
  partId: idNumber.nullable(),
  kind: z.enum(MEDIA_KINDS),
  stage: z.enum(MEDIA_STAGES).nullable(),
  caption: z.string().nullable(),
  originalName: z.string(),
  contentType: z.string(),
  sizeBytes: z.number().int(),
  sha256: z.string(),
  uploadedBy: idNumber.nullable(),
  uploadedByName: z.string().nullable(),
  createdAt: timestamp,
  /** Presigned, short-lived: the small WebP for grids (null when none could be made). */
  thumbUrl: z.string().nullable(),
  /** Presigned, short-lived: the full object, shown inline. */
  url: z.string(),
  /** Our route that redirects to a presigned URL sending the original name as an attachment. */
  downloadUrl: z.string(),
});
export type MediaRecord = z.infer<typeof MediaRecord>;

export const MediaPage = z.object({
  media: z.array(MediaRecord),
  total: z.number().int(),
  page: z.number().int(),
  pageSize: z.number().int(),
});
export type MediaPage = z.infer<typeof MediaPage>;
export const MediaAnswer = z.object({ media: MediaRecord });
export type MediaAnswer = z.infer<typeof MediaAnswer>;

export const mediaRoutes = {
  'GET /api/builds/:buildId/media': MediaPage,
  'POST /api/builds/:buildId/media': MediaAnswer,
  'PATCH /api/builds/:buildId/media/:mediaId': MediaAnswer,
} satisfies RouteTable;
