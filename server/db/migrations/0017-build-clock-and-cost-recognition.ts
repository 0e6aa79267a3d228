// Each build keeps its own clock (an IANA zone: "today" and every default date are the shop's) and
// says when a part's cost becomes actual cost: at fitting (the default) or at receipt. Parts record
// the day they were fitted, set by the database on the change to 'fitted', in the build's zone.
import type { MigrationContext } from '../migrate';

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE builds
      ADD COLUMN time_zone TEXT NOT NULL DEFAULT 'UTC' CHECK (length(time_zone) BETWEEN 1 AND 64),
      ADD COLUMN cost_recognition TEXT NOT NULL DEFAULT 'fitting' CHECK (cost_recognition IN ('fitting','receipt'));
    ALTER TABLE parts ADD COLUMN fitted_on DATE;

    -- Parts fitted before this column existed: the day their upgrade was installed, else the day received.
    UPDATE parts p SET fitted_on = coalesce(u.installed_on, p.received_on, (p.updated_at AT TIME ZONE 'UTC')::date)
      FROM upgrades u WHERE u.id = p.upgrade_id AND p.state = 'fitted';

    CREATE FUNCTION parts_stamp_fitted_on() RETURNS trigger AS $$
    BEGIN
      IF NEW.state = 'fitted' AND NEW.fitted_on IS NULL THEN
        NEW.fitted_on := (now() AT TIME ZONE coalesce((SELECT time_zone FROM builds WHERE id = NEW.build_id), 'UTC'))::date;
      ELSIF NEW.state <> 'fitted' AND TG_OP = 'UPDATE' AND OLD.state = 'fitted' THEN
        NEW.fitted_on := NULL;
      END IF;
      RETURN NEW;
    END $$ LANGUAGE plpgsql;
    CREATE TRIGGER parts_stamp_fitted_on BEFORE INSERT OR UPDATE OF state ON parts
      FOR EACH ROW EXECUTE FUNCTION parts_stamp_fitted_on();
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    DROP TRIGGER parts_stamp_fitted_on ON parts;
    DROP FUNCTION parts_stamp_fitted_on();
    ALTER TABLE parts DROP COLUMN fitted_on;
    ALTER TABLE builds DROP COLUMN time_zone, DROP COLUMN cost_recognition;
  `);
}
