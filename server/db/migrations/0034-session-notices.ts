// A session that ends or changes is announced, NOTIFY session_ended '<sid>' on commit, so every
// instance drops its kept read of that session at once (services/sessionReads.ts). Ends: sign-out,
// a new session id at sign-in, "sign out my other sessions", and the store's pruning of expired rows.
// A touch that only moves the expiry changes nothing a request reads, so it is not announced.
import type { MigrationContext } from '../migrate';

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE FUNCTION notify_session_ended() RETURNS trigger AS $$
      BEGIN
        PERFORM pg_notify('session_ended', OLD.sid);
        RETURN NULL;
      END;
    $$ LANGUAGE plpgsql;
    CREATE TRIGGER session_notify_ended AFTER DELETE ON "session"
      FOR EACH ROW EXECUTE FUNCTION notify_session_ended();
    CREATE TRIGGER session_notify_changed AFTER UPDATE ON "session"
      FOR EACH ROW WHEN (OLD.sess::text IS DISTINCT FROM NEW.sess::text) EXECUTE FUNCTION notify_session_ended();
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    DROP TRIGGER session_notify_changed ON "session";
    DROP TRIGGER session_notify_ended ON "session";
    DROP FUNCTION notify_session_ended();
  `);
}
