// The invitation link's page calls these, without sign-in: who the link is for, and setting the
// password once (mounted at /api/invitations).
import { Router } from 'express';
import rateLimit from 'express-rate-limit';
import { pgRateLimitStore } from '../middleware/rateLimitStore';
import { z } from 'zod';
import { config } from '../config';
import { AppError } from '../errors';
import { validate } from '../middleware/validate';
import { resetPasswordSchema } from '../../shared/schemas/auth';
import { acceptInvitation, readInvitation } from '../services/invitations';
import { InvitationWho } from '../../shared/contracts/auth';
import { OkAnswer } from '../../shared/contracts/common';
import { send } from './send';

const token = z.object({ token: z.string().regex(/^[A-Za-z0-9_-]{20,200}$/, 'is not a link of ours') });

export function invitationsRouter() {
  const router = Router();
  const limiter = rateLimit({
    store: pgRateLimitStore('invitation'),
    windowMs: config().LOGIN_RATE_WINDOW_MINUTES * 60_000,
    limit: config().LOGIN_RATE_LIMIT * 5,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    handler: (_req, _res, next) =>
      next(new AppError(429, 'rate_limited', 'Too many attempts. Wait a few minutes and try again.')),
  });
  router.get('/:token', limiter, validate(token, 'params'), async (req, res) => {
    send(res, InvitationWho, await readInvitation(String(req.params.token)));
  });
  router.post('/:token', limiter, validate(token, 'params'), validate(resetPasswordSchema), async (req, res) => {
    send(res, OkAnswer, await acceptInvitation(String(req.params.token), req.body.password));
  });
  return router;
}
