// The calendar feed finds its build by the SHA-256 of the token through a unique index, instead of
// loading every build: an index lookup on a hash says nothing, by its timing, about the token.
// A generated column keeps the hash right whenever the token is written or rotated.
import type { MigrationContext } from '../migrate';

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE builds ADD COLUMN calendar_token_hash TEXT GENERATED ALWAYS AS (encode(sha256(calendar_token::bytea), 'hex')) STORED;
    CREATE UNIQUE INDEX builds_calendar_token_hash_key ON builds (calendar_token_hash);
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(
    `DROP INDEX builds_calendar_token_hash_key; ALTER TABLE builds DROP COLUMN calendar_token_hash;`,
  );
}
