// The public API, without sign-in: builds marked public, requests and votes, confirmation and
// unsubscribe links. Writes are rate-limited per address and per e-mail.
import { Router } from 'express';
import rateLimit from 'express-rate-limit';
import { pgRateLimitStore } from '../middleware/rateLimitStore';
import { z } from 'zod';
import { config } from '../config';
import { AppError } from '../errors';
import { validate } from '../middleware/validate';
import { id } from '../../shared/schemas/common';
import { publicRequestSchema, publicVoteSchema } from '../../shared/schemas/viewerRequest';
import { publicBuildView } from '../services/publicBuild';
import * as votes from '../services/viewerVotes';
import { emailHash } from '../services/viewerPrivacy';

const slug = z.object({ slug: z.string().regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'is not a build address').max(60) });
const token = z.object({ token: z.string().regex(/^[A-Za-z0-9_.-]{20,200}$/, 'is not a link of ours') });
const tooMany = (_req: unknown, _res: unknown, next: (e: unknown) => void) =>
  next(new AppError(429, 'rate_limited', 'Too many requests from here. Wait a few minutes and try again.'));

export function publicRouter() {
  const c = config();
  const router = Router({ mergeParams: true });
  const windowMs = c.PUBLIC_RATE_WINDOW_MINUTES * 60_000;
  const perAddress = rateLimit({ store: pgRateLimitStore('public-write'), windowMs, limit: c.PUBLIC_WRITE_RATE_LIMIT, standardHeaders: 'draft-7', legacyHeaders: false, handler: tooMany });
  // Reads keep their counter in this process (a flood guard): a shared counter would cost a
  // database write per page view on the page that must serve an audience.
  const readPerAddress = rateLimit({ windowMs, limit: c.PUBLIC_WRITE_RATE_LIMIT * 20, standardHeaders: 'draft-7', legacyHeaders: false, handler: tooMany });
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

  router.get('/builds/:slug', readPerAddress, validate(slug, 'params'), async (req, res) => {
    res.json(await publicBuildView(String(req.params.slug)));
  });
  router.post('/builds/:slug/requests', perAddress, validate(slug, 'params'), validate(publicRequestSchema), perEmail, async (req, res) => {
    res.status(202).json(await votes.createRequest(String(req.params.slug), req.body));
  });
  router.post('/builds/:slug/requests/:requestId/votes', perAddress, validate(slug.extend({ requestId: id }), 'params'), validate(publicVoteSchema), perEmail, async (req, res) => {
    res.status(202).json(await votes.addVote(String(req.params.slug), Number(req.params.requestId), req.body));
  });
  router.get('/confirm/:token', readPerAddress, validate(token, 'params'), async (req, res) => {
    res.json(await votes.confirmVote(String(req.params.token)));
  });
  router.get('/unsubscribe/:token', readPerAddress, validate(token, 'params'), async (req, res) => {
    res.json(await votes.unsubscribe(String(req.params.token)));
  });
  return router;
}
