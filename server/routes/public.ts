// The public API, without sign-in: builds marked public, requests and votes, confirmation and
// unsubscribe links. Writes are rate-limited per address and per e-mail.
import { Router, type Request, type RequestHandler, type Response } from 'express';
import rateLimit from 'express-rate-limit';
import { pgRateLimitStore } from '../middleware/rateLimitStore';
import { z } from 'zod';
import { config } from '../config';
import { AppError } from '../errors';
import { validate } from '../middleware/validate';
import { id } from '../../shared/schemas/common';
import { publicRequestSchema, publicVoteSchema } from '../../shared/schemas/viewerRequest';
import { publicBuildAnswer } from '../services/publicBuild';
import { cachedPublic, type PublicEntry } from '../services/publicBuildCache';
import * as votes from '../services/viewerVotes';
import { emailHash } from '../services/viewerPrivacy';
import { Accepted, Confirmed } from '../../shared/contracts/public';
import { send } from './send';

const slug = z.object({
  slug: z
    .string()
    .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'is not a build address')
    .max(60),
});
const token = z.object({ token: z.string().regex(/^[A-Za-z0-9_.-]{20,200}$/, 'is not a link of ours') });
const tooMany = (_req: unknown, _res: unknown, next: (e: unknown) => void) =>
  next(new AppError(429, 'rate_limited', 'Too many requests from here. Wait a few minutes and try again.'));

/**
 * The same answer for every viewer: browsers and CDNs may keep it briefly and serve it stale while
 * they fetch it again; a repeat with the ETag gets 304. Signed-in people get no-store anyway.
 */
function sendPublic(req: Request, res: Response, entry: PublicEntry, hit: boolean) {
  const c = config();
  res.set('X-Public-Cache', hit ? 'hit' : 'miss');
  res.set(
    'Cache-Control',
    `public, max-age=${c.PUBLIC_MAX_AGE_SECONDS}, stale-while-revalidate=${c.PUBLIC_STALE_SECONDS}`,
  );
  res.set('ETag', entry.etag);
  res.vary('Accept-Encoding');
  if (req.fresh) return void res.status(304).end();
  res.type('application/json');
  if (entry.gzipped && req.acceptsEncodings('gzip', 'identity') === 'gzip') {
    res.set('Content-Encoding', 'gzip');
    return void res.send(entry.gzipped);
  }
  res.send(entry.body);
}

const servePublicFromCache: RequestHandler = (req, res, next) => {
  const hit = cachedPublic(String(req.params.slug));
  if (!hit) return next();
  sendPublic(req, res, hit, true);
};

export function publicRouter() {
  const c = config();
  const router = Router({ mergeParams: true });
  const windowMs = c.PUBLIC_RATE_WINDOW_MINUTES * 60_000;
  const perAddress = rateLimit({
    store: pgRateLimitStore('public-write'),
    windowMs,
    limit: c.PUBLIC_WRITE_RATE_LIMIT,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    handler: tooMany,
  });
  // Reads keep their counter in this process (a flood guard): a shared counter would cost a
  // database write per page view on the page that must serve an audience.
  const readPerAddress = rateLimit({
    windowMs,
    limit: c.PUBLIC_WRITE_RATE_LIMIT * 20,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    handler: tooMany,
  });
  // Per e-mail (by its keyed hash), so one inbox cannot be flooded with confirmation mail.
  const perEmail = rateLimit({
    store: pgRateLimitStore('public-email'),
    windowMs: 60 * 60_000,
    limit: c.PUBLIC_EMAIL_RATE_LIMIT,
    standardHeaders: false,
    legacyHeaders: false,
    keyGenerator: (req) => `email:${emailHash(String(req.body?.email ?? ''))}`,
    handler: tooMany,
  });

  // A copy in the cache is sent before the per-address limit: it costs no database work, and a
  // crowd behind one address (a school, a CDN without TRUST_PROXY) still sees the page.
  router.get('/builds/:slug', validate(slug, 'params'), servePublicFromCache, readPerAddress, async (req, res) => {
    const { entry, hit } = await publicBuildAnswer(String(req.params.slug));
    sendPublic(req, res, entry, hit);
  });
  router.post(
    '/builds/:slug/requests',
    perAddress,
    validate(slug, 'params'),
    validate(publicRequestSchema),
    perEmail,
    async (req, res) => {
      send(res, Accepted, await votes.createRequest(String(req.params.slug), req.body), 202);
    },
  );
  router.post(
    '/builds/:slug/requests/:requestId/votes',
    perAddress,
    validate(slug.extend({ requestId: id }), 'params'),
    validate(publicVoteSchema),
    perEmail,
    async (req, res) => {
      send(res, Accepted, await votes.addVote(String(req.params.slug), Number(req.params.requestId), req.body), 202);
    },
  );
  router.get('/confirm/:token', readPerAddress, validate(token, 'params'), async (req, res) => {
    send(res, Confirmed, await votes.confirmVote(String(req.params.token)));
  });
  router.get('/unsubscribe/:token', readPerAddress, validate(token, 'params'), async (req, res) => {
    send(res, Accepted, await votes.unsubscribe(String(req.params.token)));
  });
  return router;
}
