// An invoice stays an invoice: the money-only mark is kept on the media row itself, so a
// document does not become visible to every role when the part it was attached to is deleted.
import type { MigrationContext } from '../migrate';

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE media ADD COLUMN invoice BOOLEAN NOT NULL DEFAULT FALSE;
    UPDATE media SET invoice = TRUE WHERE kind = 'document' AND part_id IS NOT NULL;
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`ALTER TABLE media DROP COLUMN invoice;`);
}
