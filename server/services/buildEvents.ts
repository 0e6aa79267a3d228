// Live updates: one listening connection per server process (so every instance behind a load
// balancer hears every change) turns PostgreSQL's build_event notices (migration 0028) into short
// "what changed" messages for the browsers of that build. A notice names tables, never rows or
// values: the browser re-fetches through its normal, role-filtered API.
import pg from 'pg';
import { config } from '../config';

export type Listener = (what: string[]) => void;

/** Notices of one build within this window go out as one message (a save touches several tables). */
const GATHER_MS = 150;
const subscribers = new Map<number, Set<Listener>>();
const pending = new Map<number, Set<string>>();
let client: pg.Client | null = null;
let connecting: Promise<void> | null = null;
let retryTimer: NodeJS.Timeout | null = null;

/** Table names as the screens speak of them. */
const WHAT: Record<string, string> = {
  upgrades: 'upgrades',
  parts: 'parts',
  labour_entries: 'labour',
  expenses: 'expenses',
  removed_parts: 'removed-parts',
  episodes: 'episodes',
  media: 'media',
  viewer_requests: 'viewer-requests',
};

function flush(buildId: number) {
  const what = [...(pending.get(buildId) ?? [])].sort();
  pending.delete(buildId);
  for (const fn of subscribers.get(buildId) ?? []) fn(what);
}

function onNotice(msg: pg.Notification) {
  if (msg.channel !== 'build_event' || !msg.payload) return;
  const [idText, table] = msg.payload.split(':');
  const buildId = Number(idText);
  if (!subscribers.has(buildId)) return;
  const set = pending.get(buildId);
  if (set) return void set.add(WHAT[table] ?? table);
  pending.set(buildId, new Set([WHAT[table] ?? table]));
  setTimeout(() => flush(buildId), GATHER_MS).unref();
}

/** After a lost connection some notices may be missed: every browser re-fetches everything. */
function resyncAll() {
  for (const [, set] of subscribers) for (const fn of set) fn(['*']);
}

function connect(): Promise<void> {
  if (client || connecting) return connecting ?? Promise.resolve();
  const c = new pg.Client({ connectionString: config().DATABASE_URL, keepAlive: true });
  const lost = () => {
    if (client !== c) return;
    client = null;
    c.end().catch(() => undefined);
    if (!subscribers.size) return;
    retryTimer ??= setTimeout(() => {
      retryTimer = null;
      void connect().then(resyncAll);
    }, 2000);
    retryTimer.unref();
  };
  c.on('notification', onNotice);
  c.on('error', lost);
  c.on('end', lost);
  client = c;
  connecting = c
    .connect()
    .then(() => c.query('LISTEN build_event'))
    .then(() => {
      (c as unknown as { connection?: { stream?: { unref?: () => void } } }).connection?.stream?.unref?.();
    })
    .catch(lost)
    .finally(() => {
      connecting = null;
    });
  return connecting;
}

/** Starts listening if needed; answers the function that stops this subscription. */
export async function subscribe(buildId: number, fn: Listener): Promise<() => void> {
  let set = subscribers.get(buildId);
  if (!set) subscribers.set(buildId, (set = new Set()));
  set.add(fn);
  await connect();
  return () => {
    set.delete(fn);
    if (!set.size) subscribers.delete(buildId);
  };
}

/** Closes the listening connection (tests, shutdown). */
export async function stopBuildEvents() {
  const c = client;
  client = null;
  subscribers.clear();
  pending.clear();
  if (retryTimer) clearTimeout(retryTimer);
  retryTimer = null;
  if (c) await c.end().catch(() => undefined);
}
