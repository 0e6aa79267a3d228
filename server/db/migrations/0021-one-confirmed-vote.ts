// One confirmed vote per person per request, held by the database as well as by the service.
import type { MigrationContext } from '../migrate';

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE UNIQUE INDEX viewer_votes_one_confirmed_key ON viewer_votes (request_id, email_hash) WHERE confirmed_at IS NOT NULL;
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`DROP INDEX viewer_votes_one_confirmed_key;`);
}
