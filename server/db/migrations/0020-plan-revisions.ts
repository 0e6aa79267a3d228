// Plan changes the producer can trust: every applied plan (and every undo) is kept as a revision
// with the plan before and after it, so the last change can be undone and a stale apply refused.
// Viewer requests get a version, so a second concurrent accept answers 409 instead of duplicating.
import type { MigrationContext } from '../migrate';

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE plan_revisions (
      id          SERIAL PRIMARY KEY,
      build_id    INTEGER NOT NULL REFERENCES builds(id) ON DELETE CASCADE,
      -- 1, 2, 3 … per build: the plan version a change was made from is the last number.
      number      INTEGER NOT NULL CHECK (number >= 1),
      kind        TEXT NOT NULL CHECK (kind IN ('apply','undo')),
      -- For an undo: the revision it took back.
      undoes_id   INTEGER REFERENCES plan_revisions(id) ON DELETE SET NULL,
      undone_at   TIMESTAMPTZ,
      before      JSONB NOT NULL,
      after       JSONB NOT NULL,
      summary     TEXT NOT NULL CHECK (length(summary) <= 1000),
      user_id     INTEGER REFERENCES users(id) ON DELETE SET NULL,
      user_name   TEXT,
      created_at  TIMESTAMPTZ NOT NULL DEFAULT now(),
      CONSTRAINT plan_revisions_build_number_key UNIQUE (build_id, number)
    );
    ALTER TABLE viewer_requests ADD COLUMN version INTEGER NOT NULL DEFAULT 0;
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    ALTER TABLE viewer_requests DROP COLUMN version;
    DROP TABLE plan_revisions;
  `);
}
