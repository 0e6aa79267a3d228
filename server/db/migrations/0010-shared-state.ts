// State that several instances on one database share: the rate-limit counters
// (middleware/rateLimitStore.ts), and a change notice for user rows so every instance drops its
// cached copy of a person at once (NOTIFY user_changed '<id>' on commit).
import type { MigrationContext } from '../migrate';

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE rate_limit_counters (
      key TEXT PRIMARY KEY,
      hits INTEGER NOT NULL CHECK (hits >= 0),
      reset_at TIMESTAMPTZ NOT NULL
    );
    CREATE INDEX rate_limit_counters_reset_at ON rate_limit_counters (reset_at);
    CREATE FUNCTION notify_user_changed() RETURNS trigger AS $$
      BEGIN
        PERFORM pg_notify('user_changed', (CASE WHEN TG_OP = 'DELETE' THEN OLD.id ELSE NEW.id END)::text);
        RETURN NULL;
      END;
    $$ LANGUAGE plpgsql;
    CREATE TRIGGER users_notify_changed AFTER INSERT OR UPDATE OR DELETE ON users
      FOR EACH ROW EXECUTE FUNCTION notify_user_changed();
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    DROP TRIGGER users_notify_changed ON users; DROP FUNCTION notify_user_changed();
    DROP TABLE rate_limit_counters;
  `);
}
