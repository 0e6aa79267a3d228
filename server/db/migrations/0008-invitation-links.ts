// One-time links in invitation mails, with which a new person chooses their own password.
// Only a hash of each link's token is stored.
import type { MigrationContext } from '../migrate';

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE invitation_links (
      id          SERIAL PRIMARY KEY,
      user_id     INTEGER NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      token_hash  TEXT NOT NULL UNIQUE CHECK (length(token_hash) = 64),
      expires_at  TIMESTAMPTZ NOT NULL,
      used_at     TIMESTAMPTZ,
      created_at  TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE INDEX invitation_links_user_idx ON invitation_links (user_id);
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query('DROP TABLE invitation_links;');
}
