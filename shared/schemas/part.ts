// Part payloads and list query, shared by the parts screens and the API.
import { z } from 'zod';
import { PART_CONDITIONS, PART_STATES } from '../domain';
import { cents, httpUrl, isoDate, optionalText, pageQuery, requiredText } from './common';
import { refId } from './upgrade';

const nullableDate = isoDate.nullish().transform((v) => v ?? null);

const fields = {
  upgradeId: refId,
  partNumber: requiredText(60),
  description: requiredText(200),
  quantity: z.number().int('must be a whole number').min(1, 'must be at least 1').max(10_000, 'is too large'),
  unitCostCents: cents,
  retailPriceCents: cents.nullish().transform((v) => v ?? null),
  supplier: optionalText(120),
  condition: z.enum(PART_CONDITIONS),
  productUrl: httpUrl
    .nullish()
    .or(z.literal(''))
    .transform((v) => (v ? v : null)),
  expectedArrival: nullableDate,
  orderedOn: nullableDate,
  receivedOn: nullableDate,
  state: z.enum(PART_STATES),
  /** The code the store sells this part under, when it is not the part number. */
  storeSku: optionalText(60),
};

const optionalAll = Object.fromEntries(Object.entries(fields).map(([k, s]) => [k, s.optional()])) as {
  [K in keyof typeof fields]: z.ZodOptional<(typeof fields)[K]>;
};

export const createPartSchema = z.strictObject({
  ...optionalAll,
  upgradeId: fields.upgradeId,
  partNumber: fields.partNumber,
  description: fields.description,
});
export const updatePartSchema = z.strictObject({ ...optionalAll, version: z.number().int().min(0).optional() });

/** What marketing may change on a part (the store's product page). */
export const MARKETING_PART_FIELDS = ['productUrl', 'storeSku', 'version'] as const;
/** What an installer may change on a part: receive or fit it. */
export const INSTALLER_PART_FIELDS = ['state', 'receivedOn', 'version'] as const;
export const INSTALLER_PART_STATES = ['received', 'fitted'] as const;

export const partListQuery = pageQuery.extend({
  upgradeId: z.coerce.number().int().positive().optional(),
  state: z.enum(PART_STATES).optional(),
});

export type CreatePartInput = z.infer<typeof createPartSchema>;
export type UpdatePartInput = z.infer<typeof updatePartSchema>;
