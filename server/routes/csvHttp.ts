// The HTTP edge of CSV import and export: reading a text/csv body and answering results.
import type { Request, Response } from 'express';
import { AppError } from '../errors';
import type { ImportResult } from '../services/csv/common';

export function csvBody(req: Request): string {
  if (typeof req.body !== 'string')
    throw new AppError(415, 'unsupported_type', 'Send the file as CSV (Content-Type: text/csv).');
  return req.body;
}

export function sendCsv(res: Response, filename: string, text: string) {
  res.type('text/csv; charset=utf-8').attachment(filename).send(text);
}

/** Preview answers 200; a write answers 201, or 400 with every problem (and nothing written). */
export function sendImportResult<P>(res: Response, r: ImportResult<P>) {
  const body = { ok: r.ok, rows: r.rows, errors: r.errors, ...(r.created !== undefined ? { created: r.created } : {}) };
  if (r.dryRun) return res.json(body);
  if (r.ok) return res.status(201).json(body);
  res.status(400).json({
    ...body,
    error: {
      code: 'bad_csv',
      message: `${r.errors.length} problem(s) in the file; nothing was imported.`,
      fields: r.errors.map((e) => ({ path: `line ${e.line}: ${e.field}`, message: e.message })),
    },
  });
}
