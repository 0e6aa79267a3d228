// Expense payloads: any other cost of the build, optionally on an upgrade.
import { z } from 'zod';
import { cents, isoDate, optionalText, requiredText } from './common';
import { refId } from './upgrade';

const fields = {
  upgradeId: refId.nullable(),
  description: requiredText(200),
  amountCents: cents,
  spentOn: isoDate,
  category: optionalText(60),
};
const optionalAll = Object.fromEntries(Object.entries(fields).map(([k, s]) => [k, s.optional()])) as {
  [K in keyof typeof fields]: z.ZodOptional<(typeof fields)[K]>;
};

export const createExpenseSchema = z.strictObject({
  ...optionalAll,
  description: fields.description,
  amountCents: fields.amountCents,
  spentOn: fields.spentOn,
});
export const updateExpenseSchema = z.strictObject(optionalAll);

export type CreateExpenseInput = z.infer<typeof createExpenseSchema>;
export type UpdateExpenseInput = z.infer<typeof updateExpenseSchema>;
