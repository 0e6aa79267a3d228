// Starts the Bayslate server: checks its settings, migrates (one instance at a time), seeds the
// demo in demo mode only, listens; on SIGTERM stops gracefully. The local fakes (S3, SMTP) are
// not started here: `npm start` runs them in processes of their own.
import { config } from './config';
import { createApp } from './app';
import { migrate, seedDemo } from './db/migrate';
import { closeDatabaseConnections } from './db/connections';
import { installMail, startMailWorker, stopMailWorker } from './mail';
import { checkNoDemoAccounts, checkSettings, demoAccountsExist, StartupRefused } from './startupChecks';
import { markDraining } from './routes/health';
import { startUserNotices } from './services/userNotices';
import { startMediaSweeper, stopMediaSweeper } from './services/mediaSweep';
import { startReceiptSweeper, stopReceiptSweeper } from './services/requestReceipts';

async function main() {
  const c = config();
  checkSettings(c);
  installMail();
  await migrate();
  if (c.BAYSLATE_DEMO) {
    await seedDemo();
    if (!(await demoAccountsExist())) {
      throw new StartupRefused(
        'BAYSLATE_DEMO is on but no demo data could be seeded (the compiled server carries no seeders): use `npm start`.',
      );
    }
  }
  await checkNoDemoAccounts(c);
  startUserNotices();
  const app = createApp();
  // Mail goes out from the queue, outside any request (a mail outage never fails a request).
  if (c.MAIL_WORKER) startMailWorker();
  // Leftover uploads (objects no row names, temp files of broken uploads) go on a schedule.
  startMediaSweeper();
  // Receipts of resent changes older than a week, hourly.
  startReceiptSweeper();
  const server = app.listen(c.PORT, c.HOST, () => {
    const addr = server.address();
    const port = typeof addr === 'object' && addr ? addr.port : c.PORT;
    console.log(
      `[bayslate] server listening on http://${c.HOST}:${port} (${c.NODE_ENV}${c.BAYSLATE_DEMO ? ', demo data' : ''})`,
    );
  });
  // Idle kept-alive connections outlive the client's own idle limit; the wait for a request's
  // headers must be longer still, or it would end those connections first.
  server.keepAliveTimeout = c.KEEP_ALIVE_TIMEOUT_MS;
  server.headersTimeout = c.KEEP_ALIVE_TIMEOUT_MS + 1000;

  // Graceful stop: readiness turns 503, no new connections, requests in flight get up to
  // SHUTDOWN_GRACE_MS, the mail worker finishes the mail in hand, then the pools close.
  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`[bayslate] ${signal}: stopping — finishing requests in flight (up to ${c.SHUTDOWN_GRACE_MS} ms)`);
    markDraining();
    const closed = new Promise<void>((resolve) => server.close(() => resolve()));
    server.closeIdleConnections();
    const grace = new Promise<void>((resolve) => setTimeout(resolve, c.SHUTDOWN_GRACE_MS).unref());
    await Promise.all([Promise.race([closed, grace]), stopMailWorker()]);
    server.closeAllConnections();
    stopReceiptSweeper();
    await Promise.allSettled([stopMediaSweeper(), closeDatabaseConnections()]);
    console.log('[bayslate] stopped');
    process.exit(0);
  };
  process.on('SIGINT', () => void stop('SIGINT'));
  process.on('SIGTERM', () => void stop('SIGTERM'));
}

main().catch((err) => {
  const known = err instanceof StartupRefused;
  console.error(`[bayslate] the server ${known ? 'refuses to start' : 'could not start'}: ${err?.message ?? err}`);
  process.exit(1);
});
