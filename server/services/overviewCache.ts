// Keeps each build's computed overview (as the JSON bytes sent) until PostgreSQL reports that the
// build changed: triggers send NOTIFY build_changed '<id>' on commit (migration 0007). The cache
// only serves while the listening connection is up; when it drops, everything is forgotten and
// requests compute afresh until it is back.
import pg from 'pg';
import { createHash } from 'node:crypto';
import { gzipSync } from 'node:zlib';
import { config } from '../config';

export interface Entry {
  day: string;
  /** The build's time zone when computed: the entry serves while it is still `day` there. */
  zone: string;
  body: Buffer;
  /** The same bytes gzipped once, for clients that accept it (a browser always does). */
  gzipped: Buffer | null;
  etag: string;
}

const entries = new Map<number, Entry>();
/**
 * What the overview last read per build (any shape: the overview service owns it), kept while only
 * labour changes: a labour notice leaves it, any other notice of the build drops it. Its labour part
 * is never trusted (it is read again each time).
 */
const inputs = new Map<number, unknown>();
/** Bumped by every notice for a build, so a figure computed before a change is never stored after it. */
const generations = new Map<number, number>();
let allGeneration = 0;
let client: pg.Client | null = null;
let listening = false;
let connecting: Promise<void> | null = null;
let retryTimer: NodeJS.Timeout | null = null;

/** Other caches that follow the same change notices (the public build page): one listening connection for all. */
type ChangeListener = (buildId: number | null) => void;
const changeListeners = new Set<ChangeListener>();

/** Calls `fn(buildId)` on each build's change notice, and `fn(null)` when everything must be forgotten. */
export function onBuildChanged(fn: ChangeListener): () => void {
  changeListeners.add(fn);
  return () => changeListeners.delete(fn);
}

/** Whether change notices arrive now (a cache may serve only then); starts listening if not. */
export function changeNoticesLive(): boolean {
  if (!listening) void connect();
  return listening;
}

function forgetAll() {
  entries.clear();
  inputs.clear();
  allGeneration += 1;
  for (const fn of changeListeners) fn(null);
}

function onNotice(msg: pg.Notification) {
  if (msg.channel !== 'build_changed' && msg.channel !== 'build_labour_changed') return;
  if (msg.payload === '*' || !msg.payload) return forgetAll();
  const id = Number(msg.payload);
  entries.delete(id);
  // Labour alone changed (migration 0033): the rest of what was read stays good.
  if (msg.channel === 'build_changed') inputs.delete(id);
  generations.set(id, (generations.get(id) ?? 0) + 1);
  for (const fn of changeListeners) fn(id);
}

function connect(): Promise<void> {
  if (!config().OVERVIEW_CACHE || listening || connecting) return connecting ?? Promise.resolve();
  const c = new pg.Client({ connectionString: config().DATABASE_URL, keepAlive: true });
  const lost = () => {
    if (client !== c) return;
    listening = false;
    client = null;
    forgetAll();
    c.end().catch(() => undefined);
    retryTimer ??= setTimeout(() => {
      retryTimer = null;
      void connect();
    }, 2000);
    retryTimer.unref();
  };
  c.on('notification', onNotice);
  c.on('error', lost);
  c.on('end', lost);
  client = c;
  connecting = c
    .connect()
    .then(() => c.query('LISTEN build_changed; LISTEN build_labour_changed'))
    .then(() => {
      // The listening connection must not keep a finished process (a test run, a script) alive.
      (c as unknown as { connection?: { stream?: { unref?: () => void } } }).connection?.stream?.unref?.();
      forgetAll();
      listening = true;
    })
    .catch(lost)
    .finally(() => {
      connecting = null;
    });
  return connecting;
}

/** A stamp to take before reading the database; `store` refuses figures that a change has overtaken. */
export function stamp(buildId: number): string {
  void connect();
  return `${listening ? 1 : 0}:${allGeneration}:${generations.get(buildId) ?? 0}`;
}

/** The entry of a build while it is still its day: `today` gives the day in the entry's zone. */
export function cached(buildId: number, today: (zone: string) => string): Entry | null {
  if (!listening) {
    void connect();
    return null;
  }
  const e = entries.get(buildId);
  return e && e.day === today(e.zone) ? e : null;
}

const inFlight = new Map<number, { key: string; entry: Promise<Entry> }>();
/** Without change notices: the computation under way per build, and the one waiting to start after it. */
const underWay = new Map<number, Promise<unknown>>();
const waiting = new Map<number, { key: string; entry: Promise<Entry> }>();

/**
 * One computation at a time per build and key (the stamp taken before reading, the day and the
 * zone): concurrent misses wait for it instead of each reading and serialising the same figures.
 * A request with another key (a change came in) computes for itself.
 *
 * Without the listening connection no change can be seen, yet a reader must see a write it just
 * made: a request then never joins a computation that began reading before it arrived. It joins
 * the next one instead, which starts when the one under way ends, so all who arrive meanwhile share
 * one computation that reads after each of them arrived (`compute` must read everything it uses,
 * the build's own row included, when it starts).
 */
export function singleFlight(buildId: number, key: string, compute: () => Promise<Entry>): Promise<Entry> {
  if (!key.startsWith('1:')) return nextFlight(buildId, key, compute);
  const running = inFlight.get(buildId);
  if (running && running.key === key) return running.entry;
  const entry = compute().finally(() => {
    if (inFlight.get(buildId)?.entry === entry) inFlight.delete(buildId);
  });
  inFlight.set(buildId, { key, entry });
  return entry;
}

function nextFlight(buildId: number, key: string, compute: () => Promise<Entry>): Promise<Entry> {
  const start = () => {
    const entry = compute();
    const settled = entry.then(
      () => undefined,
      () => undefined,
    );
    underWay.set(buildId, settled);
    void settled.then(() => underWay.get(buildId) === settled && underWay.delete(buildId));
    return entry;
  };
  const current = underWay.get(buildId);
  if (!current) return start();
  const queued = waiting.get(buildId);
  if (queued?.key === key) return queued.entry;
  // Another day or zone than the queued one (rare): this request computes for itself.
  if (queued) return compute();
  const entry = current.then(() => {
    waiting.delete(buildId);
    return start();
  });
  waiting.set(buildId, { key, entry });
  return entry;
}

/**
 * The computation already running for this build from the same stamp (no change since it started),
 * or null. A request joining it needs neither the build's row nor a query of its own: the running
 * computation loaded them after the same last change.
 */
export function runningFor(buildId: number, before: string): Promise<Entry> | null {
  if (!before.startsWith('1:')) return null;
  const running = inFlight.get(buildId);
  return running && running.key.startsWith(`${before}|`) ? running.entry : null;
}

/** The inputs kept for a build (see `inputs`), or null; only while notices arrive. */
export function keptInputs<T>(buildId: number): T | null {
  return listening ? ((inputs.get(buildId) as T | undefined) ?? null) : null;
}

/** Keeps inputs read after stamp `before`, unless any notice for the build came in since. */
export function keepInputs(buildId: number, before: string, value: unknown) {
  if (listening && before.startsWith('1:') && before === stamp(buildId)) inputs.set(buildId, value);
}

/** Serialises the figures once; keeps them when no change notice came in since `before`. */
export function store(buildId: number, day: string, zone: string, before: string, value: unknown): Entry {
  const body = Buffer.from(JSON.stringify(value));
  const keep = listening && before.startsWith('1:') && before === stamp(buildId);
  // A copy sent many times is worth compressing harder; one sent once goes out at the fastest level.
  const entry = {
    day,
    zone,
    body,
    gzipped: body.length > 1024 ? gzipSync(body, { level: keep ? 6 : 1 }) : null,
    etag: `W/"${createHash('sha1').update(body).digest('base64url')}"`,
  };
  if (keep) entries.set(buildId, entry);
  return entry;
}

let catchUpInFlight: Promise<void> | null = null;
let catchUpNext: Promise<void> | null = null;

/**
 * Waits for one round trip on the listening connection: PostgreSQL sends the notices of every
 * transaction committed before it ahead of the answer, so a change made through another instance
 * has dropped its entry by the time this resolves.
 */
export function catchUpOverviewNotices(): Promise<void> {
  const c = client;
  if (!listening || !c) return Promise.resolve();
  const roundTrip = () =>
    c
      .query('SELECT 1')
      .then(
        () => undefined,
        () => undefined,
      )
      .finally(() => {
        catchUpInFlight = null;
      });
  if (!catchUpInFlight) return (catchUpInFlight = roundTrip());
  // The round trip under way may have left before this caller's change committed: everyone who
  // arrives meanwhile shares the next one (at most one in flight and one waiting, however busy).
  catchUpNext ??= catchUpInFlight.then(() => {
    catchUpNext = null;
    return (catchUpInFlight ??= roundTrip());
  });
  return catchUpNext;
}

/** Closes the listening connection (tests, shutdown). */
export async function stopOverviewCache() {
  const c = client;
  client = null;
  listening = false;
  forgetAll();
  if (retryTimer) clearTimeout(retryTimer);
  retryTimer = null;
  if (c) await c.end().catch(() => undefined);
}
