// Live updates: any write to a table a signed-in screen shows sends NOTIFY build_event
// '<build id>:<table>' when its transaction commits, so every server instance can tell its
// browsers what changed (services/buildEvents.ts). Separate from 0007's build_changed, whose
// payload the overview cache reads as a bare id.
import type { MigrationContext } from '../migrate';

const TABLES = [
  'upgrades',
  'parts',
  'labour_entries',
  'expenses',
  'removed_parts',
  'episodes',
  'media',
  'viewer_requests',
];

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE FUNCTION notify_build_event() RETURNS trigger AS $$
      DECLARE
        id INTEGER;
      BEGIN
        id := CASE WHEN TG_OP = 'DELETE' THEN OLD.build_id ELSE NEW.build_id END;
        PERFORM pg_notify('build_event', id::text || ':' || TG_TABLE_NAME);
        IF TG_OP = 'UPDATE' AND OLD.build_id IS DISTINCT FROM NEW.build_id THEN
          PERFORM pg_notify('build_event', OLD.build_id::text || ':' || TG_TABLE_NAME);
        END IF;
        RETURN NULL;
      END;
    $$ LANGUAGE plpgsql;
    ${TABLES.map((t) => `CREATE TRIGGER ${t}_build_event AFTER INSERT OR UPDATE OR DELETE ON ${t} FOR EACH ROW EXECUTE FUNCTION notify_build_event();`).join('\n    ')}
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ${TABLES.map((t) => `DROP TRIGGER ${t}_build_event ON ${t};`).join('\n    ')}
    DROP FUNCTION notify_build_event();
  `);
}
