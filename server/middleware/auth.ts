// Sessions in PostgreSQL, sign-in by e-mail and password, idle and absolute timeouts, and the
// cross-site request guard for state-changing requests.
import type { Express, RequestHandler } from 'express';
import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import { Passport } from 'passport';
import bcrypt from 'bcryptjs';
import pg from 'pg';
import { randomBytes } from 'node:crypto';
import rateLimit, { type Store } from 'express-rate-limit';
import { config } from '../config';
import { User } from '../models';
import { AppError } from '../errors';
import { noticesHeard, onUserChanged } from '../services/userNotices';
import { cacheSessionReads } from '../services/sessionReads';
import { isDemoEmail } from '../db/demoAccounts';

export const SESSION_COOKIE = 'bayslate.sid';

// Compared against when the e-mail is unknown, so both failures take the same time: a bcrypt hash
// of a random password nobody kept, at the same cost as real ones (PASSWORD_HASH_COST). At the
// default cost, 10, a literal, because hashing at start-up cost every start a tenth of a second of
// CPU; at another cost it is made once, on the first unknown e-mail.
export const DUMMY_HASH_COST_10 = '$2b$10$ULd2luDgNsYaTLROsa8zeuey1v2/DdCtHXSqtBGePyNSCQnvV4i32';
let dummyAtCost: { cost: number; hash: string } | null = null;
export function dummyHash(): string {
  const cost = config().PASSWORD_HASH_COST;
  if (cost === 10) return DUMMY_HASH_COST_10;
  if (dummyAtCost?.cost !== cost)
    dummyAtCost = { cost, hash: bcrypt.hashSync(randomBytes(24).toString('base64'), cost) };
  return dummyAtCost.hash;
}

declare module 'express-session' {
  interface SessionData {
    signedInAt?: number;
  }
}
declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface User {
      id: number;
      email: string;
      name: string;
      roles: string[];
    }
  }
}

export async function verifyPassword(email: string, password: string) {
  // Demo accounts sign in only in demo mode (a database once seeded keeps them).
  if (!config().BAYSLATE_DEMO && isDemoEmail(email)) email = '';
  const user = await User.findOne({ where: { email: email.trim().toLowerCase() } });
  const ok = await bcrypt.compare(password, user?.passwordHash ?? dummyHash());
  return ok && user && user.active ? user : null;
}

export function installAuth(app: Express, pool: pg.Pool) {
  const c = config();
  const PgStore = connectPgSimple(session);
  const store = new PgStore({
    pool,
    tableName: 'session',
    createTableIfMissing: false,
    pruneSessionInterval: c.isTest ? false : 600,
  });
  throttleTouches(store);
  cacheSessionReads(store, c.SESSION_READ_CACHE_MS, noticesHeard);
  app.use(
    session({
      name: SESSION_COOKIE,
      secret: c.SESSION_SECRET,
      store,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      proxy: c.publicUrl.startsWith('https://'),
      cookie: {
        httpOnly: true,
        sameSite: 'lax',
        secure: c.publicUrl.startsWith('https://') ? 'auto' : false,
        maxAge: c.SESSION_IDLE_MINUTES * 60_000,
      },
    }),
  );

  // A passport of this app's own: the package's shared instance would keep the callbacks of every
  // app created in the process, and the first one's person look-up would answer for all of them.
  const passport = new Passport();
  passport.serializeUser((user, done) => done(null, user.id));
  passport.deserializeUser((id: number, done) => {
    const hit = recentUsers.get(id);
    if (hit && Date.now() - hit.at < USER_CACHE_MS) return done(null, hit.user);
    User.findByPk(id).then(
      // A deactivated person is signed out at once: no user, and the session is dropped below.
      (user) => {
        const u = user && user.active ? (user.toPublic() as Express.User) : false;
        if (u) recentUsers.set(id, { user: u, at: Date.now() });
        else recentUsers.delete(id);
        done(null, u);
      },
      (err) => done(err),
    );
  });
  app.use(passport.initialize());
  app.use(passport.session());
  app.use(enforceSessionLimits);
}

// Under load every request would look its person up again. A looked-up person is reused for at most
// USER_CACHE_MS, and any change to a user row in this process forgets it at once, so a deactivation
// or a change of roles takes effect on the next request here (other processes: within that time).
const USER_CACHE_MS = 2000;
const recentUsers = new Map<number, { user: Express.User; at: number }>();
User.addHook('afterSave', (u: User) => void recentUsers.delete(u.id));
User.addHook('afterDestroy', (u: User) => void recentUsers.delete(u.id));
User.addHook('afterBulkUpdate', () => recentUsers.clear());
User.addHook('afterBulkDestroy', () => recentUsers.clear());
// Other instances' changes arrive as change notices (services/userNotices.ts).
onUserChanged((id) => (id === null ? recentUsers.clear() : recentUsers.delete(id)));

// rolling: true re-writes the session's expiry on every request. Doing it at most once a minute per
// session (the idle window is hours) saves a write per request; the same idea as connect-mongo's touchAfter.
const TOUCH_EVERY_MS = 60_000;
function throttleTouches(store: session.Store) {
  const touch = store.touch?.bind(store);
  if (!touch) return;
  const last = new Map<string, number>();
  store.touch = (sid, sess, cb) => {
    const now = Date.now();
    if (now - (last.get(sid) ?? 0) < TOUCH_EVERY_MS) return cb?.();
    if (last.size > 10_000) last.clear();
    last.set(sid, now);
    touch(sid, sess, cb);
  };
}

/** Ends sessions past the absolute limit, or whose person was deactivated. */
const enforceSessionLimits: RequestHandler = (req, _res, next) => {
  const s = req.session as (typeof req.session & { passport?: { user?: number } }) | undefined;
  if (!s?.passport?.user) return next();
  const tooOld = s.signedInAt && Date.now() - s.signedInAt > config().SESSION_ABSOLUTE_HOURS * 3_600_000;
  if (tooOld || !req.user) {
    return s.destroy(() => {
      req.user = undefined;
      next();
    });
  }
  next();
};

/** Signs `user` in on a fresh session id (the pre-sign-in id is thrown away). */
export function signIn(req: Parameters<RequestHandler>[0], user: Express.User): Promise<void> {
  return new Promise((resolve, reject) => {
    req.session.regenerate((err) => {
      if (err) return reject(err);
      req.login(user, (err2) => {
        if (err2) return reject(err2);
        req.session.signedInAt = Date.now();
        req.session.save((err3) => (err3 ? reject(err3) : resolve()));
      });
    });
  });
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Cross-site request guard: a state-changing request must come from our own origin (when the
 * browser says where it comes from) and must be JSON or carry our header, which a plain
 * cross-site form cannot do without a CORS preflight we never grant.
 */
export const sameOriginOnly: RequestHandler = (req, _res, next) => {
  if (SAFE_METHODS.has(req.method)) return next();
  const origin = req.get('origin');
  if (origin) {
    const own = new Set([config().publicUrl, `${req.protocol}://${req.get('host')}`]);
    if (!own.has(origin)) return next(new AppError(403, 'cross_site', 'Requests from other sites are refused.'));
  }
  const type = req.get('content-type') ?? '';
  const marked = req.get('x-requested-with') === 'Bayslate';
  if (!marked && !type.startsWith('application/json')) {
    return next(new AppError(415, 'unsupported_type', 'Send JSON (Content-Type: application/json).'));
  }
  next();
};

/**
 * Sign-in throttling per account, whatever address the attempts come from: after LOGIN_RATE_LIMIT
 * failed attempts on one (normalised) e-mail within the window, further attempts are refused
 * without checking the password. Successful sign-ins do not count. Put it after the body's
 * validation, so the e-mail is already trimmed and lower-cased. `store` holds the counters (the
 * in-memory default serves one process; pass a shared store when several instances run).
 */
export function accountSignInLimiter(store?: Store): RequestHandler {
  const c = config();
  return rateLimit({
    windowMs: c.LOGIN_RATE_WINDOW_MINUTES * 60_000,
    limit: c.LOGIN_RATE_LIMIT,
    standardHeaders: false,
    legacyHeaders: false,
    skipSuccessfulRequests: true,
    ...(store ? { store } : {}),
    keyGenerator: (req) =>
      `account:${String(req.body?.email ?? '')
        .trim()
        .toLowerCase()}`,
    handler: (_req, _res, next) =>
      next(
        new AppError(
          429,
          'too_many_attempts',
          'Too many sign-in attempts for this account. Wait a few minutes and try again.',
        ),
      ),
  });
}
