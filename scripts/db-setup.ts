// Migrates DATABASE_URL and, in demo mode, seeds the demo data. Used by the test harness to
// prepare the template database, and by anyone who wants the schema without starting the server.
import { migrate, seedDemo } from '../server/db/migrate';
import { config } from '../server/config';
import { sequelize } from '../server/models';

const migrations = await migrate();
const seeds = config().BAYSLATE_DEMO ? await seedDemo() : [];
console.log(`[bayslate] migrations run: ${migrations.length}, seeders run: ${seeds.length}`);
await sequelize.close();
