// Removed stock part payloads (what came off the vehicle and what became of it).
import { z } from 'zod';
import { DISPOSITIONS } from '../domain';
import { cents, isoDate, optionalText, requiredText } from './common';
import { refId } from './upgrade';

const fields = {
  upgradeId: refId.nullable(),
  description: requiredText(200),
  partNumber: optionalText(60),
  disposition: z.enum(DISPOSITIONS),
  expectedSaleCents: cents.nullish().transform((v) => v ?? null),
  actualSaleCents: cents.nullish().transform((v) => v ?? null),
  soldOn: isoDate.nullish().transform((v) => v ?? null),
};
const optionalAll = Object.fromEntries(Object.entries(fields).map(([k, s]) => [k, s.optional()])) as {
  [K in keyof typeof fields]: z.ZodOptional<(typeof fields)[K]>;
};

export const createRemovedPartSchema = z.strictObject({ ...optionalAll, description: fields.description });
export const updateRemovedPartSchema = z.strictObject(optionalAll);
export const upgradeFilterQuery = z.object({ upgradeId: z.coerce.number().int().positive().optional() });

export type CreateRemovedPartInput = z.infer<typeof createRemovedPartSchema>;
export type UpdateRemovedPartInput = z.infer<typeof updateRemovedPartSchema>;
