// Validates body, query or params with a zod schema from shared/; answers 400 naming each field
// in words and saying what is expected (the shared error map words every issue).
import type { RequestHandler } from 'express';
import type { ZodType } from 'zod';
import { AppError, type FieldError } from '../errors';
import { fieldLabel } from '../../shared/schemas/errorMap';
import { zodFields } from '../zodFields';

// zodFields lives beside the errors so services can word a check of their own the same way.
export { zodFields };

const labelOf = (f: FieldError) =>
  f.label ?? fieldLabel(f.path.split('.').map((p) => (/^\d+$/.test(p) ? Number(p) : p)));

/** The fields with their words added, for answers a service built by hand. */
export const labelled = (fields: FieldError[]): FieldError[] => fields.map((f) => ({ ...f, label: labelOf(f) }));

/** "Check these fields: Area: choose one of Front, Sides, …; Estimated hours: enter a number." */
export function fieldsSentence(fields: FieldError[]): string {
  return `Check these fields: ${fields.map((f) => `${labelOf(f)}: ${f.message}`).join('; ')}.`;
}

type Where = 'body' | 'query' | 'params';

export function validate<T>(schema: ZodType<T>, where: Where = 'body'): RequestHandler {
  return (req, _res, next) => {
    const parsed = schema.safeParse(req[where] ?? {});
    if (!parsed.success) {
      const fields = zodFields(parsed.error);
      return next(new AppError(400, 'bad_request', fieldsSentence(fields), fields));
    }
    // Express 5 makes req.query a getter; keep the parsed value where handlers can read it.
    if (where === 'query') (req as { validQuery?: unknown }).validQuery = parsed.data;
    else if (where === 'params') (req as { validParams?: unknown }).validParams = parsed.data;
    else req.body = parsed.data;
    next();
  };
}

/** The query object that `validate(schema, 'query')` parsed. */
export function validQuery<T>(req: unknown): T {
  return (req as { validQuery: T }).validQuery;
}
