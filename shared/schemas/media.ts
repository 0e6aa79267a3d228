// Media: the upload form's fields, the list filters, the edit body and the record the API sends.
import { z } from 'zod';
import { MEDIA_KINDS, MEDIA_STAGES, type MediaKind, type MediaStage } from '../domain';
import { id, optionalText } from './common';

/** Multipart text fields arrive as strings; empty means "not given". */
const optionalId = z.preprocess((v) => (v === '' || v === null ? undefined : v), id.optional());
const optionalEnum = <T extends readonly [string, ...string[]]>(values: T) =>
  z.preprocess((v) => (v === '' || v === null ? undefined : v), z.enum(values).optional());

export const mediaUploadFields = z.strictObject({
  kind: optionalEnum(MEDIA_KINDS),
  stage: optionalEnum(MEDIA_STAGES),
  upgradeId: optionalId,
  episodeId: optionalId,
  partId: optionalId,
  caption: optionalText(500),
});
export type MediaUploadFields = z.infer<typeof mediaUploadFields>;

export const mediaListQuery = z.strictObject({
  upgradeId: optionalId,
  episodeId: optionalId,
  partId: optionalId,
  stage: optionalEnum(MEDIA_STAGES),
  kind: optionalEnum(MEDIA_KINDS),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(48),
});
export type MediaListQuery = z.infer<typeof mediaListQuery>;

export const mediaPatch = z
  .strictObject({
    // .optional() outside: a caption left out stays undefined (kept), not null (cleared).
    caption: optionalText(500).optional(),
    stage: z.enum(MEDIA_STAGES).nullable().optional(),
  })
  .refine((b) => b.caption !== undefined || b.stage !== undefined, {
    message: 'give caption or stage',
    path: ['caption'],
  });
export type MediaPatch = z.infer<typeof mediaPatch>;

/** A media record as the API sends it: its contract is in shared/contracts/media.ts. */
export type { MediaRecord } from '../contracts/media';

export const MEDIA_STAGE_LABELS: Record<MediaStage, string> = { before: 'Before', during: 'During', after: 'After' };
export const MEDIA_KIND_LABELS: Record<MediaKind, string> = { photo: 'Photo', video: 'Video', document: 'Document' };
