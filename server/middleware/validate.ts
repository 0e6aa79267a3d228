// Validates body, query or params with a zod schema from shared/; answers 400 naming each field
// in words and saying what is expected (the shared error map words every issue).
import type { RequestHandler } from 'express';
import type { ZodError, ZodType } from 'zod';
import { AppError, type FieldError } from '../errors';
import { fieldLabel, RAW_SCHEMA_TEXT } from '../../shared/schemas/errorMap';

export function zodFields(err: ZodError): FieldError[] {
  return err.issues.map((i) => {
    const path = i.path.join('.');
    const keys = i.code === 'unrecognized_keys' ? ((i as { keys?: string[] }).keys ?? []) : [];
    // Belt and braces: a message zod wrote itself never reaches a person.
    const message = RAW_SCHEMA_TEXT.test(i.message) ? 'is not valid' : i.message;
    return { path: path || keys.join(', ') || '(body)', message, label: keys.length && !path ? 'This form' : fieldLabel(i.path) };
  });
}

const labelOf = (f: FieldError) => f.label ?? fieldLabel(f.path.split('.').map((p) => (/^\d+$/.test(p) ? Number(p) : p)));

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
