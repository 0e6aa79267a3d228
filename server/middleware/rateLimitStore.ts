// The rate-limit counters of express-rate-limit, kept in PostgreSQL (table rate_limit_counters,
// migration 0010) so that every instance on one database counts against the same limit.
// One row per key: a fixed window that starts with the first hit and ends at reset_at.
// Use: rateLimit({ ..., store: pgRateLimitStore('login') }) — one store per limiter (a prefix each).
import type { Options, Store, ClientRateLimitInfo } from 'express-rate-limit';
import { sharedPool } from '../db/pool';

let lastSweep = 0;

export class PgRateLimitStore implements Store {
  windowMs = 60_000;
  /** Counters are shared between processes (express-rate-limit reads this). */
  localKeys = false;
  constructor(public prefix: string) {}

  init(options: Options) {
    this.windowMs = options.windowMs;
  }

  private k(key: string) {
    return `${this.prefix}:${key}`;
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const r = await sharedPool().query<{ hits: number; reset_at: Date }>(
      'SELECT hits, reset_at FROM rate_limit_counters WHERE key = $1 AND reset_at > now()',
      [this.k(key)],
    );
    return r.rows[0] ? { totalHits: r.rows[0].hits, resetTime: r.rows[0].reset_at } : undefined;
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    // One statement: a new or expired row starts a window at 1, a live one adds 1; atomic across instances.
    const r = await sharedPool().query<{ hits: number; reset_at: Date }>(
      `INSERT INTO rate_limit_counters AS c (key, hits, reset_at) VALUES ($1, 1, now() + $2 * interval '1 millisecond')
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN c.reset_at <= now() THEN 1 ELSE c.hits + 1 END,
         reset_at = CASE WHEN c.reset_at <= now() THEN EXCLUDED.reset_at ELSE c.reset_at END
       RETURNING hits, reset_at`,
      [this.k(key), this.windowMs],
    );
    this.sweepNow();
    return { totalHits: r.rows[0].hits, resetTime: r.rows[0].reset_at };
  }

  async decrement(key: string): Promise<void> {
    await sharedPool().query(
      'UPDATE rate_limit_counters SET hits = GREATEST(hits - 1, 0) WHERE key = $1 AND reset_at > now()',
      [this.k(key)],
    );
  }

  async resetKey(key: string): Promise<void> {
    await sharedPool().query('DELETE FROM rate_limit_counters WHERE key = $1', [this.k(key)]);
  }

  async resetAll(): Promise<void> {
    await sharedPool().query("DELETE FROM rate_limit_counters WHERE key LIKE $1 || ':%'", [this.prefix]);
  }

  /** Expired windows are removed at most once a minute per process, off the request's path. */
  private sweepNow() {
    if (Date.now() - lastSweep < 60_000) return;
    lastSweep = Date.now();
    sharedPool()
      .query('DELETE FROM rate_limit_counters WHERE reset_at < now()')
      .catch(() => undefined);
  }
}

/** A store for one limiter; `prefix` names the limiter, so limiters never share counters. */
export const pgRateLimitStore = (prefix: string) => new PgRateLimitStore(prefix);
