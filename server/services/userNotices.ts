// Several instances (deploy): every instance keeps a short-lived copy of each signed-in person
// (middleware/auth.ts). A change to a user row anywhere sends NOTIFY user_changed '<id>'
// (migration 0010); this listener hands each notice to the cache, so a deactivation or a change
// of roles made through one instance takes effect on the next request to any of them. When the
// listening connection drops, the cache is told to forget everyone until it is back.
import pg from 'pg';
import { config } from '../config';

type Handler = (id: number | null) => void;
const handlers: Handler[] = [];
let client: pg.Client | null = null;
let listening = false;
let retry: NodeJS.Timeout | null = null;
let stopped = false;

const tell = (id: number | null) => handlers.forEach((h) => h(id));

/** `handler(id)` for one person, `handler(null)` for everyone. */
export function onUserChanged(handler: Handler) {
  handlers.push(handler);
}

/** Starts listening (server/index.ts; a test app in one process needs no notices). */
export function startUserNotices() {
  stopped = false;
  connect();
}

/** True while notices arrive; until then a cached person must not be trusted across instances. */
export const userNoticesLive = () => listening;

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
  });
  c.connect()
    .then(() => c.query('LISTEN user_changed'))
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
