// Validates body, query or params with a zod schema from shared/; answers 400 naming each field.
import type { RequestHandler } from 'express';
import type { ZodError, ZodType } from 'zod';
import { AppError, type FieldError } from '../errors';

export function zodFields(err: ZodError): FieldError[] {
  return err.issues.map((i) => {
    const path = i.path.join('.');
    const unknown = i.code === 'unrecognized_keys' ? ` (${(i as { keys?: string[] }).keys?.join(', ')})` : '';
    return { path: path || (unknown ? unknown.slice(2, -1) : '(body)'), message: i.message + unknown };
  });
}

type Where = 'body' | 'query' | 'params';

export function validate<T>(schema: ZodType<T>, where: Where = 'body'): RequestHandler {
  return (req, _res, next) => {
    const parsed = schema.safeParse(req[where] ?? {});
    if (!parsed.success) {
      const fields = zodFields(parsed.error);
      const names = fields.map((f) => f.path).join(', ');
      return next(new AppError(400, 'bad_request', `Check these fields: ${names}.`, fields));
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
