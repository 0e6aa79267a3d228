// Labour hours summed per build, upgrade and day, kept by triggers on labour_entries, so the build
// overview reads a few hundred sums instead of every labour entry (issue 12, speed without the
// cache). Hours are summed as NUMERIC: adding and taking away entries leaves no rounding drift, and
// concurrent writers to one day add into the same row under its lock (no lost update).
// A labour entry's change is announced on its own channel, NOTIFY build_labour_changed '<build id>',
// instead of 0007's build_changed: the overview cache then re-reads only these sums and keeps the
// rest of what it read (services/overviewCache.ts); other build_changed listeners are told as before.
import type { MigrationContext } from '../migrate';

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE labour_day_totals (
      build_id   INTEGER NOT NULL,
      upgrade_id INTEGER NOT NULL,
      worked_on  DATE NOT NULL,
      hours      NUMERIC NOT NULL,
      entries    INTEGER NOT NULL CHECK (entries > 0),
      PRIMARY KEY (build_id, upgrade_id, worked_on)
    );
    INSERT INTO labour_day_totals (build_id, upgrade_id, worked_on, hours, entries)
      SELECT build_id, upgrade_id, worked_on, sum(hours::numeric), count(*) FROM labour_entries GROUP BY build_id, upgrade_id, worked_on;

    CREATE FUNCTION labour_day_totals_apply() RETURNS trigger AS $$
      BEGIN
        IF TG_OP IN ('UPDATE', 'DELETE') THEN
          DELETE FROM labour_day_totals
           WHERE build_id = OLD.build_id AND upgrade_id = OLD.upgrade_id AND worked_on = OLD.worked_on AND entries = 1;
          UPDATE labour_day_totals SET hours = hours - OLD.hours::numeric, entries = entries - 1
           WHERE build_id = OLD.build_id AND upgrade_id = OLD.upgrade_id AND worked_on = OLD.worked_on;
        END IF;
        IF TG_OP IN ('INSERT', 'UPDATE') THEN
          INSERT INTO labour_day_totals (build_id, upgrade_id, worked_on, hours, entries)
            VALUES (NEW.build_id, NEW.upgrade_id, NEW.worked_on, NEW.hours::numeric, 1)
            ON CONFLICT (build_id, upgrade_id, worked_on)
            DO UPDATE SET hours = labour_day_totals.hours + EXCLUDED.hours, entries = labour_day_totals.entries + 1;
        END IF;
        RETURN NULL;
      END;
    $$ LANGUAGE plpgsql;
    CREATE TRIGGER labour_entries_day_totals AFTER INSERT OR UPDATE OR DELETE ON labour_entries
      FOR EACH ROW EXECUTE FUNCTION labour_day_totals_apply();

    CREATE FUNCTION notify_build_labour_changed() RETURNS trigger AS $$
      BEGIN
        PERFORM pg_notify('build_labour_changed', (CASE WHEN TG_OP = 'DELETE' THEN OLD.build_id ELSE NEW.build_id END)::text);
        IF TG_OP = 'UPDATE' AND OLD.build_id IS DISTINCT FROM NEW.build_id THEN
          PERFORM pg_notify('build_labour_changed', OLD.build_id::text);
        END IF;
        RETURN NULL;
      END;
    $$ LANGUAGE plpgsql;
    DROP TRIGGER labour_entries_notify_changed ON labour_entries;
    CREATE TRIGGER labour_entries_notify_changed AFTER INSERT OR UPDATE OR DELETE ON labour_entries
      FOR EACH ROW EXECUTE FUNCTION notify_build_labour_changed();

    CREATE FUNCTION labour_day_totals_truncate() RETURNS trigger AS $$
      BEGIN TRUNCATE labour_day_totals; RETURN NULL; END;
    $$ LANGUAGE plpgsql;
    CREATE TRIGGER labour_entries_day_totals_truncated AFTER TRUNCATE ON labour_entries
      FOR EACH STATEMENT EXECUTE FUNCTION labour_day_totals_truncate();
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    DROP TRIGGER labour_entries_notify_changed ON labour_entries;
    CREATE TRIGGER labour_entries_notify_changed AFTER INSERT OR UPDATE OR DELETE ON labour_entries
      FOR EACH ROW EXECUTE FUNCTION notify_build_changed();
    DROP FUNCTION notify_build_labour_changed();
    DROP TRIGGER labour_entries_day_totals ON labour_entries;
    DROP TRIGGER labour_entries_day_totals_truncated ON labour_entries;
    DROP FUNCTION labour_day_totals_apply();
    DROP FUNCTION labour_day_totals_truncate();
    DROP TABLE labour_day_totals;
  `);
}
