// Labour entry payloads: hours by a person on an upgrade on a date.
import { z } from 'zod';
import { LABOUR_KINDS } from '../domain';
import { isoDate, optionalText, requiredText } from './common';
import { refId } from './upgrade';

const fields = {
  upgradeId: refId,
  userId: refId.nullable(),
  personName: requiredText(120),
  workedOn: isoDate,
  hours: z.number().gt(0, 'must be more than 0').max(24, 'a day has 24 hours'),
  kind: z.enum(LABOUR_KINDS),
  note: optionalText(500),
};
const optionalAll = Object.fromEntries(Object.entries(fields).map(([k, s]) => [k, s.optional()])) as {
  [K in keyof typeof fields]: z.ZodOptional<(typeof fields)[K]>;
};

export const createLabourSchema = z.strictObject({
  ...optionalAll,
  upgradeId: fields.upgradeId,
  workedOn: fields.workedOn,
  hours: fields.hours,
});
export const updateLabourSchema = z.strictObject(optionalAll);

export type CreateLabourInput = z.infer<typeof createLabourSchema>;
export type UpdateLabourInput = z.infer<typeof updateLabourSchema>;
