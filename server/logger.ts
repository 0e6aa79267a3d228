// Structured JSON logs (pino) and the per-request log line with its id (pino-http). No cookies,
// passwords or link tokens are ever written: headers are not logged, bodies are not logged, and
// the secret part of a link in a URL is masked.
import { randomUUID } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import { pino } from 'pino';
import { pinoHttp } from 'pino-http';
import { config } from './config';

let current: pino.Logger | null = null;

/** The process-wide logger. Quiet in tests unless LOG_REQUESTS or LOG_TEST_ERRORS asks for lines. */
export function logger(): pino.Logger {
  if (current) return current;
  const c = config();
  const level = c.LOG_LEVEL ?? (c.isTest && !c.LOG_REQUESTS && !c.LOG_TEST_ERRORS ? 'silent' : 'info');
  current = pino({
    level,
    base: { service: 'bayslate' },
    // A second guard behind the serializers: these never reach a log line whatever logs them.
    redact: {
      paths: [
        'req.headers.cookie',
        'req.headers.authorization',
        'res.headers["set-cookie"]',
        '*.password',
        '*.currentPassword',
        '*.newPassword',
        '*.token',
        '*.passwordHash',
      ],
      censor: '[removed]',
    },
  });
  return current;
}

// Links whose last path segment is a secret: invitations, vote confirmations, unsubscribes, feeds.
const SECRET_PATHS =
  /^(\/api\/invitations|\/api\/public\/confirm|\/api\/public\/unsubscribe|\/api\/calendar|\/welcome|\/confirm|\/unsubscribe)\/[^/?#]+/;

/** The URL as it may be logged: the token of a secret link masked, the query string left out. */
export function loggableUrl(url: string | undefined): string {
  const pathOnly = (url ?? '').split('?')[0]!;
  return pathOnly.replace(SECRET_PATHS, '$1/[token]');
}

const REQUEST_ID = /^[A-Za-z0-9._:-]{6,100}$/;

/** Request ids: a trusted proxy's X-Request-Id when one is set, else a fresh UUID; sent back in X-Request-Id. */
export function requestLogger(log: pino.Logger = logger()) {
  const trustIncoming = !!config().trustProxy;
  return pinoHttp({
    logger: log,
    genReqId(req: IncomingMessage, res: ServerResponse) {
      const given = req.headers['x-request-id'];
      const id = trustIncoming && typeof given === 'string' && REQUEST_ID.test(given) ? given : randomUUID();
      res.setHeader('X-Request-Id', id);
      return id;
    },
    serializers: {
      req: (req: { id: unknown; method: string; url: string; raw?: { ip?: string } }) => ({
        id: req.id,
        method: req.method,
        url: loggableUrl(req.url),
        ip: req.raw?.ip,
      }),
      res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
    },
    customLogLevel: (_req, res, err) =>
      err || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'warn' : 'info',
    // Load balancers ask for liveness every few seconds; those lines would drown the rest.
    autoLogging: { ignore: (req) => req.url === '/api/health/live' },
  });
}
