// Upgrade payloads and the backlog's list query, shared by the backlog screens and the API.
// Tire sizes are checked with shared/tires.ts so a wheel-and-tire upgrade always carries sizes it can compare.
import { z } from 'zod';
import { AREAS, INSTALL_STATES, SAFETY_FLAGS, SEGMENT_STATES } from '../domain';
import { parseTireSize } from '../tires';
import { cents, hours, isoDate, optionalText, pageQuery, requiredText, safeString } from './common';

export const refId = z.number().int('must be a whole number').positive('must be a positive id');

const tireSize = z
  .string()
  .trim()
  .max(30, 'must be at most 30 characters')
  .nullish()
  .transform((v) => (v === '' || v === undefined ? null : v))
  .superRefine((v, ctx) => {
    if (v === null) return;
    const r = parseTireSize(v);
    if (!r.ok) ctx.addIssue({ code: 'custom', message: r.error });
  });

const flags = z
  .array(z.enum(SAFETY_FLAGS))
  .max(SAFETY_FLAGS.length)
  .transform((v) => [...new Set(v)]);

const fields = {
  title: requiredText(140),
  replaces: optionalText(200),
  becomes: optionalText(200),
  area: z.enum(AREAS),
  estimatedHours: hours,
  valueAddedCents: cents,
  priority: z.number().int('must be a whole number').min(1, 'must be 1–5').max(5, 'must be 1–5'),
  safetyFlags: flags,
  installState: z.enum(INSTALL_STATES),
  installSegment: z.enum(SEGMENT_STATES),
  demoSegment: z.enum(SEGMENT_STATES),
  installedOn: isoDate.nullish().transform((v) => v ?? null),
  episodeId: refId.nullable(),
  notes: optionalText(4000),
  tireFrom: tireSize,
  tireTo: tireSize,
};

const optionalAll = Object.fromEntries(Object.entries(fields).map(([k, s]) => [k, s.optional()])) as {
  [K in keyof typeof fields]: z.ZodOptional<(typeof fields)[K]>;
};

export const createUpgradeSchema = z.strictObject({
  ...optionalAll,
  title: fields.title,
  area: fields.area,
  prerequisiteIds: z.array(refId).max(500).optional(),
});

export const updateUpgradeSchema = z.strictObject({
  ...optionalAll,
  version: z.number().int().min(0),
  /** Goes with installState "installed": the person was told which parts are not received and goes ahead. */
  confirmPartsNotReceived: z.boolean().optional(),
});

/** Fields an installer may change on an upgrade (with version); anything else is refused 403. */
export const INSTALLER_UPGRADE_FIELDS = [
  'installState',
  'installSegment',
  'demoSegment',
  'version',
  'confirmPartsNotReceived',
] as const;

export const prerequisitesSchema = z.strictObject({ prerequisiteIds: z.array(refId).max(500) });

export const UPGRADE_SORTS = ['title', 'area', 'priority', 'estimatedHours', 'installState', 'episode'] as const;

export const upgradeListQuery = pageQuery.extend({
  area: z.enum(AREAS).optional(),
  installState: z.enum(INSTALL_STATES).optional(),
  episodeId: z.union([z.literal('none'), z.coerce.number().int().positive()]).optional(),
  safetyFlag: z.enum(SAFETY_FLAGS).optional(),
  q: safeString().trim().max(100).optional(),
  sort: z.enum(UPGRADE_SORTS).default('priority'),
  dir: z.enum(['asc', 'desc']).default('asc'),
});

export type CreateUpgradeInput = z.infer<typeof createUpgradeSchema>;
export type UpdateUpgradeInput = z.infer<typeof updateUpgradeSchema>;
export type UpgradeListQuery = z.infer<typeof upgradeListQuery>;
