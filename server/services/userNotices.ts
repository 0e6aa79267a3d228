// Several instances (deploy): every instance keeps a short-lived copy of each signed-in person
// (middleware/auth.ts). A change to a user row anywhere sends NOTIFY user_changed '<id>'
// (migration 0010); this listener hands each notice to the cache, so a deactivation or a change
// of roles made through one instance takes effect on the next request to any of them. The same
// connection hears NOTIFY session_ended '<sid>' (migration 0034) for the session-read cache
// (services/sessionReads.ts). When the listening connection drops, both caches are told to forget
// everything, and kept session reads are not used until it is back.
import pg from 'pg';
import { config } from '../config';
import { forgetSessionReads } from './sessionReads';

type Handler = (id: number | null) => void;
const handlers: Handler[] = [];
let client: pg.Client | null = null;
let listening = false;
let retry: NodeJS.Timeout | null = null;
let stopped = false;
let started = false;

const tell = (id: number | null) => {
  handlers.forEach((h) => h(id));
  if (id === null) forgetSessionReads(null);
};

/** `handler(id)` for one person, `handler(null)` for everyone. */
export function onUserChanged(handler: Handler) {
  handlers.push(handler);
}

/** Starts listening (server/index.ts; a test app in one process needs no notices). */
export function startUserNotices() {
  stopped = false;
  started = true;
  connect();
}

/**
 * Whether a kept copy may be used: notices arrive, or this process never listened for them (one app
 * in one process, as in tests and benchmarks, where every change is made here and forgotten here).
 */
export const noticesHeard = () => listening || !started;

function connect() {
  if (client || stopped) return;
  const c = new pg.Client({ connectionString: config().DATABASE_URL, keepAlive: true });
  client = c;
  const lost = () => {
    if (client !== c) return;
    client = null;
    listening = false;
    tell(null);
    c.end().catch(() => undefined);
    if (stopped) return;
    retry ??= setTimeout(() => {
      retry = null;
      connect();
    }, 2000);
    retry.unref();
  };
  c.on('error', lost);
  c.on('end', lost);
  c.on('notification', (m) => {
    if (m.channel === 'user_changed') tell(m.payload ? Number(m.payload) : null);
    if (m.channel === 'session_ended') forgetSessionReads(m.payload || null);
  });
  c.connect()
    .then(() => c.query('LISTEN user_changed; LISTEN session_ended'))
    .then(() => {
      (c as unknown as { connection?: { stream?: { unref?: () => void } } }).connection?.stream?.unref?.();
      tell(null);
      listening = true;
    })
    .catch(lost);
}

export async function stopUserNotices() {
  stopped = true;
  const c = client;
  client = null;
  listening = false;
  if (retry) clearTimeout(retry);
  await c?.end().catch(() => undefined);
}
