// Every connection a server process holds to PostgreSQL, closed in one place: the model layer's
// pool, the shared pool (sessions, sign-in limits) and the three listening connections (overview
// cache, live build events, user notices). The graceful stop closes them all, and so does the end of
// each API test file (a worker runs many files; connections left open piled up until PostgreSQL
// refused new ones). A new pool or listener is added here.
import { sequelize } from '../models';
import { closeSharedPool } from './pool';
import { stopUserNotices } from '../services/userNotices';
import { stopOverviewCache } from '../services/overviewCache';
import { stopBuildEvents } from '../services/buildEvents';

export async function closeDatabaseConnections(): Promise<void> {
  // The listening connections do not keep the process alive (they are unref'd so that a process
  // may end with them open). While they end, something must: once the pools have gone, a stop
  // could otherwise reach an empty event loop and exit before its last step (seen: the graceful
  // stop exited 0 without "[bayslate] stopped").
  const hold = setInterval(() => undefined, 60_000);
  try {
    await Promise.allSettled([
      stopUserNotices(),
      stopOverviewCache(),
      stopBuildEvents(),
      closeSharedPool(),
      sequelize.close(),
    ]);
  } finally {
    clearInterval(hold);
  }
}
