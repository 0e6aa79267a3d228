// Run as a process of its own by tests/api/connectionsClosed.test.ts: opens every connection a server
// holds to PostgreSQL, ends the pools, and then closes the rest with closeDatabaseConnections() — as
// the last step of the graceful stop does once the pools have gone — and says when that has finished.
import { noticesHeard, startUserNotices } from '../../server/services/userNotices';
import { subscribe } from '../../server/services/buildEvents';
import { catchUpOverviewNotices } from '../../server/services/overviewCache';
import { closeSharedPool, sharedPool } from '../../server/db/pool';
import { sequelize } from '../../server/models';
import { closeDatabaseConnections } from '../../server/db/connections';

const pause = () => new Promise((r) => setTimeout(r, 20));

startUserNotices();
await sharedPool().query('SELECT 1');
await sequelize.query('SELECT 1');
const unsubscribe = await subscribe(1, () => undefined);
await catchUpOverviewNotices();
// The user notices connect in the background: wait until they listen.
for (const until = Date.now() + 10_000; !noticesHeard() && Date.now() < until;) await pause();
unsubscribe();
// The pools end first, and their sockets are gone: only the three listening connections are left.
await Promise.all([closeSharedPool(), sequelize.close()]);
const sockets = () => process.getActiveResourcesInfo().filter((r) => r === 'TCPSocketWrap').length;
for (const until = Date.now() + 10_000; sockets() > 0 && Date.now() < until;) await pause();
console.log(`listening: ${noticesHeard()}; pool sockets left: ${sockets()}`);
await closeDatabaseConnections();
console.log('all connections closed');
