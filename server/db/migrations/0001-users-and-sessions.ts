// People, their roles, and the session store (connect-pg-simple's table).
import type { MigrationContext } from '../migrate';

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE users (
      id            SERIAL PRIMARY KEY,
      email         TEXT NOT NULL CHECK (email = lower(email) AND length(email) BETWEEN 3 AND 254),
      name          TEXT NOT NULL CHECK (length(name) BETWEEN 1 AND 120),
      password_hash TEXT NOT NULL,
      roles         TEXT[] NOT NULL DEFAULT '{}'
                    CHECK (roles <@ ARRAY['owner','producer','installer','marketing']::TEXT[]),
      active        BOOLEAN NOT NULL DEFAULT TRUE,
      created_at    TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at    TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX users_email_key ON users (email);

    CREATE TABLE "session" (
      sid    VARCHAR NOT NULL PRIMARY KEY,
      sess   JSON NOT NULL,
      expire TIMESTAMP(6) NOT NULL
    );
    CREATE INDEX session_expire_idx ON "session" (expire);
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query('DROP TABLE "session"; DROP TABLE users;');
}
