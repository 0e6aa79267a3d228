// Starts the Bayslate server: migrates, seeds the demo (once), starts local fakes, listens.
import { config } from './config';
import { createApp } from './app';
import { migrate, seedDemo } from './db/migrate';
import { sequelize } from './models';
import { startLocalServices, stopLocalServices } from './localServices';

async function main() {
  const c = config();
  await migrate();
  if (c.BAYSLATE_DEMO) await seedDemo();
  await startLocalServices();
  const app = createApp();
  const server = app.listen(c.PORT, c.HOST, () => {
    const addr = server.address();
    const port = typeof addr === 'object' && addr ? addr.port : c.PORT;
    console.log(`[bayslate] server listening on http://${c.HOST}:${port}`);
  });
  const stop = async () => {
    server.close();
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
