// The public build page is cached until its build changes; it also shows viewer requests and
// their votes, so those tables send the same build_changed notice (migration 0007) on commit.
import type { MigrationContext } from '../migrate';

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TRIGGER viewer_requests_notify_changed AFTER INSERT OR UPDATE OR DELETE ON viewer_requests
      FOR EACH ROW EXECUTE FUNCTION notify_build_changed();
    CREATE TRIGGER viewer_requests_notify_truncated AFTER TRUNCATE ON viewer_requests
      FOR EACH STATEMENT EXECUTE FUNCTION notify_all_builds_changed();
    -- A vote names its request, not its build.
    CREATE FUNCTION notify_vote_changed() RETURNS trigger AS $$
      DECLARE
        b INTEGER;
      BEGIN
        SELECT build_id INTO b FROM viewer_requests
          WHERE id = CASE WHEN TG_OP = 'DELETE' THEN OLD.request_id ELSE NEW.request_id END;
        IF FOUND THEN PERFORM pg_notify('build_changed', b::text); END IF;
        RETURN NULL;
      END;
    $$ LANGUAGE plpgsql;
    CREATE TRIGGER viewer_votes_notify_changed AFTER INSERT OR UPDATE OR DELETE ON viewer_votes
      FOR EACH ROW EXECUTE FUNCTION notify_vote_changed();
    CREATE TRIGGER viewer_votes_notify_truncated AFTER TRUNCATE ON viewer_votes
      FOR EACH STATEMENT EXECUTE FUNCTION notify_all_builds_changed();
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    DROP TRIGGER viewer_votes_notify_truncated ON viewer_votes; DROP TRIGGER viewer_votes_notify_changed ON viewer_votes;
    DROP FUNCTION notify_vote_changed();
    DROP TRIGGER viewer_requests_notify_truncated ON viewer_requests; DROP TRIGGER viewer_requests_notify_changed ON viewer_requests;
  `);
}
