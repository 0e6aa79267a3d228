// Baselines and slip notices. An episode's baseline is its shoot and release dates when it is first
// scheduled with dates; a trigger takes it, so every route that schedules an episode agrees. Notices
// are the planner's in-app alerts (a late part, a release at risk); each person marks them seen.
import type { MigrationContext } from '../migrate';

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE episodes
      ADD COLUMN baseline_shoot_date DATE,
      ADD COLUMN baseline_release_date DATE,
      ADD COLUMN baselined_at TIMESTAMPTZ;

    CREATE FUNCTION episodes_take_baseline() RETURNS trigger AS $$
      BEGIN
        IF NEW.state <> 'draft' AND NEW.baselined_at IS NULL
           AND (NEW.shoot_date IS NOT NULL OR NEW.release_date IS NOT NULL) THEN
          NEW.baseline_shoot_date := NEW.shoot_date;
          NEW.baseline_release_date := NEW.release_date;
          NEW.baselined_at := now();
        END IF;
        RETURN NEW;
      END;
    $$ LANGUAGE plpgsql;
    CREATE TRIGGER episodes_take_baseline BEFORE INSERT OR UPDATE ON episodes
      FOR EACH ROW EXECUTE FUNCTION episodes_take_baseline();
    -- Episodes already past draft take today's dates as their baseline.
    UPDATE episodes SET baselined_at = NULL WHERE state <> 'draft';

    CREATE TABLE notices (
      id          SERIAL PRIMARY KEY,
      build_id    INTEGER NOT NULL REFERENCES builds(id) ON DELETE CASCADE,
      kind        TEXT NOT NULL CHECK (kind IN ('release_at_risk','part_overdue','part_later')),
      message     TEXT NOT NULL CHECK (length(message) BETWEEN 1 AND 1000),
      data        JSONB NOT NULL DEFAULT '{}',
      dedupe_key  TEXT NOT NULL,
      created_at  TIMESTAMPTZ NOT NULL DEFAULT now(),
      CONSTRAINT notices_build_dedupe_key UNIQUE (build_id, dedupe_key)
    );
    CREATE INDEX notices_build_created ON notices (build_id, id DESC);

    CREATE TABLE notice_reads (
      user_id       INTEGER NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      build_id      INTEGER NOT NULL REFERENCES builds(id) ON DELETE CASCADE,
      last_seen_id  INTEGER NOT NULL,
      PRIMARY KEY (user_id, build_id)
    );
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    DROP TABLE notice_reads; DROP TABLE notices;
    DROP TRIGGER episodes_take_baseline ON episodes; DROP FUNCTION episodes_take_baseline();
    ALTER TABLE episodes DROP COLUMN baseline_shoot_date, DROP COLUMN baseline_release_date, DROP COLUMN baselined_at;
  `);
}
