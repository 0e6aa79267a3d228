// The one error type the API throws; the error middleware turns it into JSON.
export interface FieldError {
  path: string;
  message: string;
  /** The field in words ("Area", "Chapters, row 3: title"). */
  label?: string;
}

export class AppError extends Error {
  constructor(
    public status: number,
    public code: string,
    message: string,
    public fields?: FieldError[],
    public details?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export const badRequest = (message: string, fields?: FieldError[]) => new AppError(400, 'bad_request', message, fields);
export const unauthorized = (message = 'Sign in first.') => new AppError(401, 'unauthorized', message);
export const forbidden = (message = 'Your role does not allow this.') => new AppError(403, 'forbidden', message);
export const notFound = (what = 'Record') => new AppError(404, 'not_found', `${what} not found.`);
export const conflict = (message: string, details?: Record<string, unknown>) =>
  new AppError(409, 'conflict', message, undefined, details);
export const unprocessable = (message: string, details?: Record<string, unknown>) =>
  new AppError(422, 'unprocessable', message, undefined, details);
