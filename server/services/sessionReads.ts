// Under load every signed-in request would read its session row again, one query per request before
// any feature runs. A session read is reused for at most SESSION_READ_CACHE_MS (the same idea as the
// person cache in middleware/auth.ts):
// - a change or an end of the session in this process forgets it at once (the store's set and
//   destroy, and endSessionsOf in services/users.ts);
// - one made through another instance arrives as a change notice (NOTIFY session_ended, migration
//   0034; services/userNotices.ts);
// - while notices were started but their connection is down, every read goes to the database.
// A read that started before a change is never kept, so a late answer cannot bring an old copy back.
// The store's own expiry check stands: a kept read is used only within `ms` of the database saying
// the session was valid. (The expiry written inside the session is not a guide: the store's touch
// moves only the row's expiry column, so after the idle time the written one is always past.)

/** The part of a session store this wraps (express-session's Store has these). */
export interface SessionStoreLike {
  get(sid: string, cb: (err: unknown, sess?: object | null) => void): void;
  set(sid: string, sess: object, cb?: (err?: unknown) => void): void;
  destroy(sid: string, cb?: (err?: unknown) => void): void;
}

type Kept = { json: string; at: number };

// More sessions than this in the copy (or changes remembered) and it starts again empty.
const MOST = 10_000;
const caches = new Set<{ forget: (sid: string | null) => void }>();

/** Forgets the kept copy of `sid` in every wrapped store of this process (null: of every session). */
export function forgetSessionReads(sid: string | null): void {
  for (const c of caches) c.forget(sid);
}

/**
 * Wraps `store` so that a session read within `ms` of the last one comes from memory. `trusted()`
 * says whether kept copies may be used now (false while another instance's changes could go unheard).
 */
export function cacheSessionReads(store: SessionStoreLike, ms: number, trusted: () => boolean): void {
  if (ms <= 0) return;
  const kept = new Map<string, Kept>();
  // Each change counts one; a read is kept only if nothing changed its session (or everything) after it began.
  let changes = 0;
  let allChangedAt = 0;
  const changedAt = new Map<string, number>();
  const forget = (sid: string | null) => {
    changes += 1;
    if (sid === null || changedAt.size >= MOST) {
      kept.clear();
      changedAt.clear();
      allChangedAt = changes;
      return;
    }
    kept.delete(sid);
    changedAt.set(sid, changes);
  };
  caches.add({ forget });

  const get = store.get.bind(store);
  const set = store.set.bind(store);
  const destroy = store.destroy.bind(store);
  store.get = (sid, cb) => {
    const now = Date.now();
    const useKept = trusted();
    const hit = useKept ? kept.get(sid) : undefined;
    if (hit && now - hit.at < ms) return cb(null, JSON.parse(hit.json));
    const began = changes;
    get(sid, (err, sess) => {
      const unchanged = began >= allChangedAt && (changedAt.get(sid) ?? 0) <= began;
      if (!err && sess && useKept && unchanged) {
        if (kept.size >= MOST) kept.clear();
        kept.set(sid, { json: JSON.stringify(sess), at: now });
      }
      cb(err, sess);
    });
  };
  // Forgotten before the write (reads from now on go to the database) and after it (a read that
  // began while it was being written saw the old row).
  store.set = (sid, sess, cb) => {
    forget(sid);
    set(sid, sess, (err) => {
      forget(sid);
      cb?.(err);
    });
  };
  store.destroy = (sid, cb) => {
    forget(sid);
    destroy(sid, (err) => {
      forget(sid);
      cb?.(err);
    });
  };
}
