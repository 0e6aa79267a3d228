// The mail worker claims a mail for a while instead of holding a row lock while it talks to SMTP:
// claimed_until says until when it is taken; a claim that runs out (a crashed worker) frees it.
import type { MigrationContext } from '../migrate';

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE mail_outbox ADD COLUMN claimed_until TIMESTAMPTZ, ADD COLUMN claim_id UUID;
    CREATE INDEX mail_outbox_failed_idx ON mail_outbox (created_at) WHERE state = 'failed';
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(
    `DROP INDEX mail_outbox_failed_idx; ALTER TABLE mail_outbox DROP COLUMN claimed_until, DROP COLUMN claim_id;`,
  );
}
