// Builds the Express app: security headers, JSON parsing, sessions, the API and the client.
import express, { type Express } from 'express';
import helmet from 'helmet';
import path from 'node:path';
import fs from 'node:fs';
import pg from 'pg';
import { config } from './config';
import { installAuth, sameOriginOnly } from './middleware/auth';
import { errorHandler, notFoundHandler } from './middleware/errors';
import { mountRoutes } from './routes';
import { devMailRouter } from './routes/devMail';
import { installMail } from './mail';
import { sharedPool } from './db/pool';
import { healthProbesRouter } from './routes/health';
import { catchUpOverviewNotices } from './services/overviewCache';
import { idempotentChanges } from './middleware/idempotency';
import { ownHostOnly } from './middleware/host';
import compression from 'compression';
import { requestLogger } from './logger';
import { noStoreByDefault, noStoreWhenSignedIn } from './middleware/caching';

/** The pool the session store uses (also used by the bench's bare route); it has an 'error' listener (db/pool.ts). */
export function getSessionPool(): pg.Pool {
  return sharedPool();
}

export function createApp(): Express {
  const c = config();
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', c.trustProxy);
  // A JSON log line with a request id for every request (X-Request-Id), then the host check.
  app.use(requestLogger());
  app.use(ownHostOnly);
  // JSON and static files go out compressed when the client accepts it (1 kB and larger).
  app.use(compression());
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'default-src': ["'self'"],
          'img-src': [
            "'self'",
            'data:',
            'blob:',
            ...(c.S3_ENDPOINT ? [new URL(c.S3_ENDPOINT).origin] : ['http://127.0.0.1:*']),
          ],
          'media-src': [
            "'self'",
            'blob:',
            ...(c.S3_ENDPOINT ? [new URL(c.S3_ENDPOINT).origin] : ['http://127.0.0.1:*']),
          ],
          'connect-src': ["'self'", ...(c.S3_ENDPOINT ? [new URL(c.S3_ENDPOINT).origin] : ['http://127.0.0.1:*'])],
          'style-src': ["'self'", "'unsafe-inline'"],
          'script-src': ["'self'"],
          'upgrade-insecure-requests': c.publicUrl.startsWith('https://') ? [] : null,
        },
      },
      strictTransportSecurity: c.publicUrl.startsWith('https://'),
      crossOriginEmbedderPolicy: false,
    }),
  );
  app.use('/api', noStoreByDefault);
  app.use('/api', express.json({ limit: '2mb', strict: true }));
  app.use('/api', express.text({ type: 'text/csv', limit: '10mb' }));
  // Load balancers' probes answer before any session lookup (deploy): /live does no I/O at all.
  app.use('/api/health', healthProbesRouter());
  installAuth(app, getSessionPool());
  app.use('/api', noStoreWhenSignedIn);
  app.use('/api', sameOriginOnly);
  // Several instances (deploy): before answering from its overview cache, an instance reads the
  // change notices PostgreSQL already has for it, so a write made through another instance shows at once.
  app.use(
    '/api/builds/:buildId/overview',
    (_req, _res, next) => void catchUpOverviewNotices().then(() => next(), next),
  );
  // A change sent again with the same Idempotency-Key happens once (the phone's waiting changes).
  app.use('/api', idempotentChanges);
  mountRoutes(app);
  app.use('/api', notFoundHandler);
  installMail();
  // The development inbox (demo mode only), outside /api and before the client's catch-all route.
  if (c.BAYSLATE_DEMO) app.use('/dev/mail', devMailRouter());

  const dist = path.resolve(c.CLIENT_DIST);
  if (c.SERVE_CLIENT && fs.existsSync(path.join(dist, 'index.html'))) {
    app.use(express.static(dist, { index: false, maxAge: '1h' }));
    // Client-side routes: every other GET answers the app shell.
    // `root` keeps a client folder under a dot-folder (.data/dist-…) servable: send refuses dot segments only below it.
    app.get(/^\/(?!api\/).*/, (_req, res) => res.sendFile('index.html', { root: dist }));
  }
  app.use(errorHandler);
  return app;
}
