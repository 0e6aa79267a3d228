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
  await Promise.allSettled([
    stopUserNotices(),
    stopOverviewCache(),
    stopBuildEvents(),
    closeSharedPool(),
    sequelize.close(),
  ]);
}
