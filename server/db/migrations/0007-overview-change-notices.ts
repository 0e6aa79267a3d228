// Change notices for the build overview's cache: any write to a table the overview reads sends
// NOTIFY build_changed '<build id>' when its transaction commits (PostgreSQL folds repeats of one
// payload within a transaction into one notice, so bulk writes send one per build).
import type { MigrationContext } from '../migrate';

const TABLES = ['upgrades', 'parts', 'labour_entries', 'expenses', 'removed_parts', 'episodes'];

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE FUNCTION notify_build_changed() RETURNS trigger AS $$
      DECLARE
        id INTEGER;
      BEGIN
        IF TG_TABLE_NAME = 'builds' THEN
          id := CASE WHEN TG_OP = 'DELETE' THEN OLD.id ELSE NEW.id END;
        ELSE
          id := CASE WHEN TG_OP = 'DELETE' THEN OLD.build_id ELSE NEW.build_id END;
        END IF;
        PERFORM pg_notify('build_changed', id::text);
        -- A record moved to another build changes both.
        IF TG_OP = 'UPDATE' AND TG_TABLE_NAME <> 'builds' THEN
          IF OLD.build_id IS DISTINCT FROM NEW.build_id THEN
            PERFORM pg_notify('build_changed', OLD.build_id::text);
          END IF;
        END IF;
        RETURN NULL;
      END;
    $$ LANGUAGE plpgsql;
    CREATE TRIGGER builds_notify_changed AFTER INSERT OR UPDATE OR DELETE ON builds
      FOR EACH ROW EXECUTE FUNCTION notify_build_changed();
    ${TABLES.map((t) => `CREATE TRIGGER ${t}_notify_changed AFTER INSERT OR UPDATE OR DELETE ON ${t} FOR EACH ROW EXECUTE FUNCTION notify_build_changed();`).join('\n    ')}
    -- TRUNCATE has no rows: tell every listener to drop everything.
    CREATE FUNCTION notify_all_builds_changed() RETURNS trigger AS $$
      BEGIN PERFORM pg_notify('build_changed', '*'); RETURN NULL; END;
    $$ LANGUAGE plpgsql;
    ${['builds', ...TABLES].map((t) => `CREATE TRIGGER ${t}_notify_truncated AFTER TRUNCATE ON ${t} FOR EACH STATEMENT EXECUTE FUNCTION notify_all_builds_changed();`).join('\n    ')}
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ${['builds', ...TABLES].map((t) => `DROP TRIGGER ${t}_notify_changed ON ${t}; DROP TRIGGER ${t}_notify_truncated ON ${t};`).join('\n    ')}
    DROP FUNCTION notify_build_changed(); DROP FUNCTION notify_all_builds_changed();
  `);
}
