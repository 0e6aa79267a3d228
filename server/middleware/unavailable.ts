// Deploy: while PostgreSQL is down (stopped, restarting, failing over) a request answers 503 with
// a clear message instead of a 500; the pools reconnect by themselves once it is back.
const PG_DOWN_CODES = new Set(['57P01', '57P02', '57P03', '08000', '08001', '08003', '08004', '08006', '53300']);
const NET_DOWN_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'ENOTFOUND', 'EAI_AGAIN']);
const CONNECTION_ERRORS = new Set([
  'SequelizeConnectionError',
  'SequelizeConnectionRefusedError',
  'SequelizeConnectionTimedOutError',
  'SequelizeHostNotReachableError',
  'SequelizeConnectionAcquireTimeoutError',
]);
const MESSAGES = [
  /Connection terminated/i,
  /terminating connection/i,
  /timeout exceeded when trying to connect/i,
  /Client has encountered a connection error/i,
  /the database system is (starting up|shutting down)/i,
];

type Err = {
  name?: string;
  code?: string;
  message?: string;
  parent?: unknown;
  original?: unknown;
  cause?: unknown;
  errors?: unknown[];
};

/** True when `err` says the database cannot be reached right now (not a bad query). */
export function isDatabaseUnavailable(err: unknown, depth = 0): boolean {
  if (!err || typeof err !== 'object' || depth > 4) return false;
  const e = err as Err;
  if (e.name && CONNECTION_ERRORS.has(e.name)) return true;
  if (e.code && (PG_DOWN_CODES.has(e.code) || NET_DOWN_CODES.has(e.code))) return true;
  if (e.message && MESSAGES.some((m) => m.test(e.message!))) return true;
  // AggregateError (a refused connection on every address) and wrapped errors.
  for (const inner of [e.parent, e.original, e.cause, ...(Array.isArray(e.errors) ? e.errors : [])])
    if (inner && isDatabaseUnavailable(inner, depth + 1)) return true;
  return false;
}

export const UNAVAILABLE_MESSAGE = 'The database is not reachable right now. Try again in a minute.';
