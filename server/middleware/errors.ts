// The one error middleware: every failure answers JSON { error: { code, message, fields? } }.
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import {
  ForeignKeyConstraintError,
  OptimisticLockError,
  UniqueConstraintError,
  ValidationError as SequelizeValidationError,
  DatabaseError,
} from 'sequelize';
import { AppError } from '../errors';
import { config } from '../config';
import { fieldsSentence, labelled, zodFields } from './validate';
import { isDatabaseUnavailable, UNAVAILABLE_MESSAGE } from './unavailable';

export const notFoundHandler: RequestHandler = (_req, _res, next) => {
  next(new AppError(404, 'not_found', 'No such API route.'));
};

export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  let e: AppError;
  if (err instanceof AppError) e = err;
  else if (err instanceof ZodError) e = new AppError(400, 'bad_request', 'Some fields are not valid.', zodFields(err));
  else if (err?.type === 'entity.parse.failed')
    e = new AppError(400, 'bad_json', 'The request body is not valid JSON.');
  else if (err?.type === 'entity.too.large') e = new AppError(413, 'too_large', 'The request body is too large.');
  else if (err instanceof OptimisticLockError)
    e = new AppError(409, 'stale', 'Someone else changed this record since you loaded it. Reload to see their change.');
  else if (err instanceof UniqueConstraintError)
    e = new AppError(
      409,
      'duplicate',
      'A record with the same value already exists.',
      (err.errors ?? []).map((x) => ({ path: x.path ?? '', message: 'must be unique' })),
    );
  else if (err instanceof ForeignKeyConstraintError)
    e = new AppError(409, 'in_use', 'This record is linked to others and cannot be changed that way.');
  else if (err instanceof SequelizeValidationError)
    e = new AppError(
      400,
      'bad_request',
      'Some fields are not valid.',
      err.errors.map((x) => ({ path: x.path ?? '', message: x.message })),
    );
  else if (err instanceof DatabaseError && (err.parent as { code?: string })?.code === '23514')
    e = new AppError(
      400,
      'bad_request',
      `A value is out of its allowed range (${(err.parent as { constraint?: string }).constraint ?? 'check'}).`,
    );
  else if (isDatabaseUnavailable(err)) e = new AppError(503, 'unavailable', UNAVAILABLE_MESSAGE);
  else {
    // pino-http's line for this request carries the error too (res.err), under the same id.
    res.err = err instanceof Error ? err : new Error(String(err));
    if (config().isTest && config().LOG_TEST_ERRORS) console.error(`[error] ${req.method} ${req.originalUrl}`, err);
    e = new AppError(
      500,
      'internal',
      config().NODE_ENV === 'development' ? String(err?.message ?? err) : 'Something went wrong on the server.',
    );
  }
  if (res.headersSent) return;
  // A person can quote this id; the log line of the request has the same one.
  const requestId = e.status >= 500 ? { requestId: String(req.id ?? '') } : {};
  // Field errors name the field in words; a hand-made "Check these fields: episodeId." is reworded.
  const fields = e.fields?.length ? labelled(e.fields) : undefined;
  const message =
    fields && e.status === 400 && e.message.startsWith('Check these fields:') ? fieldsSentence(fields) : e.message;
  res.status(e.status).json({
    error: { code: e.code, message, ...(fields ? { fields } : {}), ...(e.details ?? {}), ...requestId },
  });
};
