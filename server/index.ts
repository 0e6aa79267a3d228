// Starts the Bayslate server: starts local fakes, migrates, seeds the demo (once), listens.
import { config } from './config';
import { createApp } from './app';
import { migrate, seedDemo } from './db/migrate';
import { sequelize } from './models';
import { startLocalServices, stopLocalServices } from './localServices';
import { installMail, startMailWorker, stopMailWorker } from './mail';
import { startMediaSweeper, stopMediaSweeper } from './services/mediaSweep';

async function main() {
  const c = config();
  // Local fakes first: the demo seeders store media in the (fake) object storage.
  installMail();
  await startLocalServices();
  await migrate();
  if (c.BAYSLATE_DEMO) await seedDemo();
  const app = createApp();
  // Mail goes out from the queue, outside any request (a mail outage never fails a request).
  if (c.MAIL_WORKER) startMailWorker();
  // Leftover uploads (objects no row names, temp files of broken uploads) go on a schedule.
  startMediaSweeper();
  const server = app.listen(c.PORT, c.HOST, () => {
    const addr = server.address();
    const port = typeof addr === 'object' && addr ? addr.port : c.PORT;
    console.log(`[bayslate] server listening on http://${c.HOST}:${port}`);
  });
  const stop = async () => {
    server.close();
    await stopMailWorker();
    await stopMediaSweeper();
    await stopLocalServices();
    await sequelize.close();
    process.exit(0);
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

main().catch((err) => {
  console.error('[bayslate] the server could not start:', err?.message ?? err);
  process.exit(1);
});
