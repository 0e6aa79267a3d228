// Receipts of changes sent with an Idempotency-Key header (the phone's waiting changes): when the
// network drops after the server saved a change but before the answer arrived, the phone sends it
// again with the same key and gets the first answer back instead of a second copy of the change.
// A receipt without a status is a change still being saved.
import type { MigrationContext } from '../migrate';

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE request_receipts (
      user_id     INTEGER NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      key         TEXT NOT NULL CHECK (length(key) BETWEEN 8 AND 100),
      method      TEXT NOT NULL,
      path        TEXT NOT NULL,
      status      INTEGER,
      body        JSONB,
      created_at  TIMESTAMPTZ NOT NULL DEFAULT now(),
      PRIMARY KEY (user_id, key)
    );
    CREATE INDEX request_receipts_created_idx ON request_receipts (created_at);
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query('DROP TABLE request_receipts;');
}
