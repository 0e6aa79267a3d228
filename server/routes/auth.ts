// Sign-in, sign-out, who am I, and changing one's own password.
import { Router } from 'express';
import rateLimit, { ipKeyGenerator } from 'express-rate-limit';
import { config } from '../config';
import { pgRateLimitStore } from '../middleware/rateLimitStore';
import { validate } from '../middleware/validate';
import { requireSignedIn } from '../middleware/roles';
import { accountSignInLimiter, signIn, verifyPassword, SESSION_COOKIE } from '../middleware/auth';
import { loginSchema, changePasswordSchema } from '../../shared/schemas/auth';
import { AppError } from '../errors';
import { changeOwnPassword } from '../services/users';
import { SessionAnswer, type SessionUser } from '../../shared/contracts/auth';
import { OkAnswer } from '../../shared/contracts/common';
import { send } from './send';

export function authRouter() {
  const router = Router();
  const c = config();
  const loginLimiter = rateLimit({
    store: pgRateLimitStore('login'),
    windowMs: c.LOGIN_RATE_WINDOW_MINUTES * 60_000,
    limit: c.LOGIN_RATE_LIMIT,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    // Count per address and e-mail together, and per address alone at a looser limit below.
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${String(req.body?.email ?? '').toLowerCase()}`,
    handler: (_req, _res, next) =>
      next(new AppError(429, 'too_many_attempts', 'Too many sign-in attempts. Wait a few minutes and try again.')),
  });
  const addressLimiter = rateLimit({
    store: pgRateLimitStore('login-address'),
    windowMs: c.LOGIN_RATE_WINDOW_MINUTES * 60_000,
    limit: c.LOGIN_RATE_LIMIT * 5,
    standardHeaders: false,
    legacyHeaders: false,
    handler: (_req, _res, next) =>
      next(new AppError(429, 'too_many_attempts', 'Too many sign-in attempts. Wait a few minutes and try again.')),
  });

  const accountLimiter = accountSignInLimiter(pgRateLimitStore('login-account'));
  router.post('/login', addressLimiter, validate(loginSchema), loginLimiter, accountLimiter, async (req, res) => {
    const user = await verifyPassword(req.body.email, req.body.password);
    // One answer for an unknown e-mail and a wrong password.
    if (!user) throw new AppError(401, 'bad_credentials', 'That e-mail and password do not match an active account.');
    await signIn(req, user.toPublic() as Express.User);
    send(res, SessionAnswer, { user: user.toPublic() });
  });

  router.post('/logout', (req, res, next) => {
    req.logout((err) => {
      if (err) return next(err);
      req.session.destroy(() => {
        res.clearCookie(SESSION_COOKIE);
        send(res, OkAnswer, { ok: true });
      });
    });
  });

  router.get('/me', requireSignedIn, (req, res) => {
    send(res, SessionAnswer, { user: req.user as SessionUser });
  });

  router.post('/password', requireSignedIn, validate(changePasswordSchema), async (req, res) => {
    await changeOwnPassword(req.user!, req.body.currentPassword, req.body.newPassword, req.sessionID);
    send(res, OkAnswer, { ok: true });
  });

  return router;
}
