// Every setting Bayslate reads from the environment, validated once, with defaults.
// Nothing else in the server reads process.env.
import { z } from 'zod';

const bool = (def: boolean) =>
  z
    .enum(['0', '1', 'true', 'false', 'yes', 'no'])
    .optional()
    .transform((v) => (v === undefined ? def : ['1', 'true', 'yes'].includes(v)));

const schema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  PUBLIC_URL: z.string().url().optional(),
  DATABASE_URL: z.string().min(1, 'DATABASE_URL is required (npm start sets it for the local cluster)'),
  DATABASE_POOL_MAX: z.coerce.number().int().min(1).default(10),
  SESSION_SECRET: z.string().min(16, 'SESSION_SECRET must be at least 16 characters'),
  SESSION_IDLE_MINUTES: z.coerce
    .number()
    .int()
    .min(1)
    .default(8 * 60),
  SESSION_ABSOLUTE_HOURS: z.coerce
    .number()
    .int()
    .min(1)
    .default(7 * 24),
  // How long a session read is reused before the row is read again (services/sessionReads.ts);
  // changes made anywhere are heard at once through change notices. 0: read it on every request.
  SESSION_READ_CACHE_MS: z.coerce.number().int().min(0).max(60_000).default(2000),
  // bcrypt's cost for stored passwords (each step doubles the work). 10 or more in production; the
  // test harness lowers it so its hundreds of sign-ins do not each cost a tenth of a second of CPU.
  PASSWORD_HASH_COST: z.coerce.number().int().min(4).max(15).default(10),
  LOGIN_RATE_LIMIT: z.coerce.number().int().min(1).default(10),
  LOGIN_RATE_WINDOW_MINUTES: z.coerce.number().int().min(1).default(15),
  // Demo data and accounts: off unless asked for (`npm start` and the tests turn it on).
  BAYSLATE_DEMO: bool(false),
  SERVE_CLIENT: bool(true),
  CLIENT_DIST: z.string().default('dist'),
  LOG_REQUESTS: bool(false),
  // Unexpected errors are quiet in tests unless this is on.
  LOG_TEST_ERRORS: bool(false),
  // Object storage: with S3_ENDPOINT unset the server runs a local fake S3 on loopback.
  S3_ENDPOINT: z.string().url().optional(),
  S3_BUCKET: z.string().default('bayslate-media'),
  S3_REGION: z.string().default('us-east-1'),
  S3_ACCESS_KEY_ID: z.string().default('S3RVER'),
  S3_SECRET_ACCESS_KEY: z.string().default('S3RVER'),
  S3_FORCE_PATH_STYLE: bool(true),
  LOCAL_S3_PORT: z.coerce.number().int().min(0).default(0),
  LOCAL_S3_DIR: z.string().default('.data/s3'),
  UPLOAD_DIR: z.string().default('.data/uploads'),
  UPLOAD_MAX_PHOTO_MB: z.coerce.number().positive().default(40),
  UPLOAD_MAX_VIDEO_MB: z.coerce.number().positive().default(4096),
  UPLOAD_MAX_DOCUMENT_MB: z.coerce.number().positive().default(25),
  // How long a presigned media URL stays valid (short: links must not outlive a role change).
  MEDIA_URL_TTL_SECONDS: z.coerce
    .number()
    .int()
    .min(10)
    .max(7 * 24 * 3600)
    .default(900),
  // E-mail: with SMTP_URL unset the server runs a local fake SMTP server on loopback.
  SMTP_URL: z.string().optional(),
  MAIL_FROM: z.string().default('Bayslate <no-reply@bayslate.test>'),
  LOCAL_SMTP_PORT: z.coerce.number().int().min(0).default(0),
  LOCAL_MAIL_DIR: z.string().default('.data/mail'),
  MAIL_WORKER: bool(true),
  MAIL_POLL_MS: z.coerce.number().int().min(10).default(2000),
  // The build overview keeps each build's computed figures until the database reports a change.
  OVERVIEW_CACHE: bool(true),
  MAIL_RETRY_BASE_MS: z.coerce.number().int().min(1).default(30_000),
  MAIL_MAX_ATTEMPTS: z.coerce.number().int().min(1).default(8),
  // Viewer requests: how long a confirmation link works, and the public write limits.
  CONFIRM_LINK_HOURS: z.coerce.number().positive().default(48),
  PUBLIC_RATE_WINDOW_MINUTES: z.coerce.number().int().min(1).default(15),
  PUBLIC_WRITE_RATE_LIMIT: z.coerce.number().int().min(1).default(30),
  PUBLIC_EMAIL_RATE_LIMIT: z.coerce.number().int().min(1).default(5),
  // Running it for real (deploy): how long a stopping server lets requests in flight finish, and
  // how long each readiness check may take.
  SHUTDOWN_GRACE_MS: z.coerce.number().int().min(0).default(10_000),
  // How long an idle kept-alive connection stays open. Longer than clients and proxies keep theirs
  // (Node's own clients 5 s, load balancers commonly 60 s), so the server never closes a connection
  // at the moment a client reuses it (that race ends the client's request with ECONNRESET).
  KEEP_ALIVE_TIMEOUT_MS: z.coerce.number().int().min(1000).default(65_000),
  READY_CHECK_TIMEOUT_MS: z.coerce.number().int().min(50).default(1000),
  // Hardening (issue 10). Host names besides PUBLIC_URL's that requests may name (comma list, host[:port]).
  ALLOWED_HOSTS: z.string().default(''),
  // How many proxies in front of the server to believe about the viewer's address: 0/false (none),
  // a number of hops, or a comma list of proxy addresses/subnets ('loopback', '10.0.0.0/8'). Unset: one
  // hop when PUBLIC_URL is https, none otherwise.
  TRUST_PROXY: z.string().optional(),
  // The secret that keys viewers' address hashes and unsubscribe links (HKDF, a label per purpose).
  // Required in production; development and tests derive a fixed stand-in.
  VIEWER_KEY_SECRET: z.string().min(32, 'VIEWER_KEY_SECRET must be at least 32 characters').optional(),
  // Orphaned uploads: how often the sweeper runs and how old an unreferenced object or temp file must be.
  MEDIA_SWEEP_MINUTES: z.coerce.number().int().min(0).default(60),
  MEDIA_SWEEP_GRACE_MINUTES: z.coerce
    .number()
    .int()
    .min(1)
    .default(24 * 60),
  // The public build page's answer: seconds a browser or CDN may reuse it, and serve it stale while refreshing.
  PUBLIC_MAX_AGE_SECONDS: z.coerce.number().int().min(0).default(30),
  PUBLIC_STALE_SECONDS: z.coerce.number().int().min(0).default(60),
  // How long a claimed mail stays with one worker before another may take it (a crashed worker).
  MAIL_CLAIM_SECONDS: z.coerce.number().int().min(5).default(120),
  // Log level of the JSON logs (pino): fatal, error, warn, info, debug, trace or silent. Unset: info
  // (silent in tests unless LOG_REQUESTS or LOG_TEST_ERRORS is on).
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).optional(),
  // Unconfirmed votes waiting for their link: at most this many per request, and per person.
  PENDING_VOTES_PER_REQUEST: z.coerce.number().int().min(1).default(200),
  PENDING_VOTES_PER_ADDRESS: z.coerce.number().int().min(1).default(5),
});

/** The lowest bcrypt cost a production server accepts (OWASP's password storage cheat sheet: 10 or more). */
export const MIN_PRODUCTION_HASH_COST = 10;

export type Config = ReturnType<typeof loadConfig>;

export function loadConfig(env: NodeJS.ProcessEnv = process.env) {
  const parsed = schema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Bayslate configuration is not valid:\n${lines.join('\n')}`);
  }
  const c = parsed.data;
  if (c.NODE_ENV === 'production' && c.PASSWORD_HASH_COST < MIN_PRODUCTION_HASH_COST)
    throw new Error(
      `Bayslate configuration is not valid:\n  PASSWORD_HASH_COST: must be ${MIN_PRODUCTION_HASH_COST} or more in production (it is ${c.PASSWORD_HASH_COST}; unset it for the default, 10)`,
    );
  return {
    ...c,
    isProduction: c.NODE_ENV === 'production',
    isTest: c.NODE_ENV === 'test',
    publicUrl: (c.PUBLIC_URL ?? `http://${c.HOST}:${c.PORT}`).replace(/\/$/, ''),
    trustProxy: trustProxySetting(c.TRUST_PROXY, (c.PUBLIC_URL ?? '').startsWith('https://')),
    viewerKeySecret: viewerKeySecret(c),
  };
}

/** Express's 'trust proxy' value from TRUST_PROXY. */
function trustProxySetting(v: string | undefined, https: boolean): boolean | number | string {
  if (v === undefined || v === '') return https ? 1 : false;
  if (['0', 'false', 'no'].includes(v)) return false;
  if (['true', 'yes'].includes(v)) return true;
  if (/^\d+$/.test(v)) return Number(v);
  return v;
}

function viewerKeySecret(c: z.infer<typeof schema>): string {
  if (c.VIEWER_KEY_SECRET) return c.VIEWER_KEY_SECRET;
  if (c.NODE_ENV === 'production')
    throw new Error(
      'Bayslate configuration is not valid:\n  VIEWER_KEY_SECRET: is required in production (32 or more random characters, e.g. `openssl rand -base64 48`)',
    );
  // Development and tests: a fixed stand-in (npm start writes a real one under .data).
  return 'bayslate-development-viewer-key-not-for-production';
}

let current: Config | null = null;

/** The process-wide configuration, read on first use. */
export function config(): Config {
  current ??= loadConfig();
  return current;
}
