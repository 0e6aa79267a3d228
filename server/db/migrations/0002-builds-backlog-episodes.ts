// Builds, their upgrades with prerequisites, parts, removed parts, labour, expenses, episodes
// with chapters, and the append-only activity record. Rules the data must always keep are
// constraints here, not only code: a prerequisite stays inside its build, states are closed lists.
import type { MigrationContext } from '../migrate';

const list = (values: string[]) => values.map((v) => `'${v}'`).join(',');
const AREAS = list(['front', 'sides', 'rear', 'cabin', 'electrical', 'wheels_chassis']);
const FLAGS = list(['srs_airbag', 'brakes', 'lighting', 'rear_camera', 'wheels_tires', 'high_current', 'lifting']);
const HTTP_URL = `~ '^https?://[^\\s]+$'`;

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE builds (
      id                      SERIAL PRIMARY KEY,
      slug                    TEXT NOT NULL UNIQUE CHECK (slug ~ '^[a-z0-9]+(-[a-z0-9]+)*$' AND length(slug) <= 60),
      name                    TEXT NOT NULL CHECK (length(name) BETWEEN 1 AND 120),
      year                    INTEGER NOT NULL CHECK (year BETWEEN 1900 AND 2100),
      make                    TEXT NOT NULL CHECK (length(make) BETWEEN 1 AND 60),
      model                   TEXT NOT NULL CHECK (length(model) BETWEEN 1 AND 60),
      trim                    TEXT NOT NULL DEFAULT '' CHECK (length(trim) <= 60),
      vin                     TEXT CHECK (vin IS NULL OR length(vin) = 17),
      vin_check_overridden    BOOLEAN NOT NULL DEFAULT FALSE,
      mileage                 INTEGER CHECK (mileage IS NULL OR mileage >= 0),
      budget_cents            INTEGER CHECK (budget_cents IS NULL OR budget_cents >= 0),
      labour_rate_cents       INTEGER CHECK (labour_rate_cents IS NULL OR labour_rate_cents >= 0),
      shop_hours_per_week     DOUBLE PRECISION NOT NULL DEFAULT 20 CHECK (shop_hours_per_week > 0 AND shop_hours_per_week <= 168),
      shoot_hours_per_episode DOUBLE PRECISION NOT NULL DEFAULT 8 CHECK (shoot_hours_per_episode > 0 AND shoot_hours_per_episode <= 200),
      release_cadence_days    INTEGER NOT NULL DEFAULT 7 CHECK (release_cadence_days BETWEEN 1 AND 365),
      start_date              DATE NOT NULL DEFAULT CURRENT_DATE,
      is_public               BOOLEAN NOT NULL DEFAULT FALSE,
      campaign                TEXT CHECK (campaign IS NULL OR campaign ~ '^[a-z0-9_-]{1,60}$'),
      summary                 TEXT CHECK (summary IS NULL OR length(summary) <= 2000),
      calendar_token          TEXT NOT NULL UNIQUE CHECK (length(calendar_token) >= 32),
      version                 INTEGER NOT NULL DEFAULT 0,
      created_at              TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at              TIMESTAMPTZ NOT NULL DEFAULT now()
    );

    CREATE TABLE episodes (
      id              SERIAL PRIMARY KEY,
      build_id        INTEGER NOT NULL REFERENCES builds(id) ON DELETE CASCADE,
      number          INTEGER NOT NULL CHECK (number > 0),
      title           TEXT NOT NULL CHECK (length(title) BETWEEN 1 AND 140),
      summary         TEXT CHECK (summary IS NULL OR length(summary) <= 4000),
      state           TEXT NOT NULL DEFAULT 'draft' CHECK (state IN ('draft','scheduled','shot','in_edit','live')),
      shoot_date      DATE,
      release_date    DATE,
      video_url       TEXT CHECK (video_url IS NULL OR video_url ${HTTP_URL}),
      runtime_seconds INTEGER CHECK (runtime_seconds IS NULL OR runtime_seconds > 0),
      published_at    TIMESTAMPTZ,
      version         INTEGER NOT NULL DEFAULT 0,
      created_at      TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at      TIMESTAMPTZ NOT NULL DEFAULT now(),
      CONSTRAINT episodes_dates_in_order CHECK (release_date IS NULL OR shoot_date IS NULL OR release_date >= shoot_date),
      CONSTRAINT episodes_build_number_key UNIQUE (build_id, number) DEFERRABLE INITIALLY DEFERRED,
      CONSTRAINT episodes_build_id_id_key UNIQUE (build_id, id)
    );

    CREATE TABLE upgrades (
      id                 SERIAL PRIMARY KEY,
      build_id           INTEGER NOT NULL REFERENCES builds(id) ON DELETE CASCADE,
      title              TEXT NOT NULL CHECK (length(title) BETWEEN 1 AND 140),
      replaces           TEXT CHECK (replaces IS NULL OR length(replaces) <= 200),
      becomes            TEXT CHECK (becomes IS NULL OR length(becomes) <= 200),
      area               TEXT NOT NULL CHECK (area IN (${AREAS})),
      estimated_hours    DOUBLE PRECISION NOT NULL DEFAULT 0 CHECK (estimated_hours >= 0 AND estimated_hours <= 1000),
      value_added_cents  INTEGER NOT NULL DEFAULT 0 CHECK (value_added_cents >= 0),
      priority           INTEGER NOT NULL DEFAULT 3 CHECK (priority BETWEEN 1 AND 5),
      safety_flags       TEXT[] NOT NULL DEFAULT '{}' CHECK (safety_flags <@ ARRAY[${FLAGS}]::TEXT[]),
      install_state      TEXT NOT NULL DEFAULT 'queued' CHECK (install_state IN ('queued','in_bay','installed')),
      install_segment    TEXT NOT NULL DEFAULT 'not_shot' CHECK (install_segment IN ('not_shot','shot')),
      demo_segment       TEXT NOT NULL DEFAULT 'not_shot' CHECK (demo_segment IN ('not_shot','shot')),
      installed_on       DATE,
      episode_id         INTEGER,
      episode_position   INTEGER CHECK (episode_position IS NULL OR episode_position >= 0),
      notes              TEXT CHECK (notes IS NULL OR length(notes) <= 4000),
      tire_from          TEXT CHECK (tire_from IS NULL OR length(tire_from) <= 30),
      tire_to            TEXT CHECK (tire_to IS NULL OR length(tire_to) <= 30),
      version            INTEGER NOT NULL DEFAULT 0,
      created_at         TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at         TIMESTAMPTZ NOT NULL DEFAULT now(),
      CONSTRAINT upgrades_build_id_id_key UNIQUE (build_id, id),
      CONSTRAINT upgrades_episode_same_build FOREIGN KEY (build_id, episode_id)
        REFERENCES episodes (build_id, id) ON DELETE SET NULL (episode_id)
    );
    CREATE INDEX upgrades_build_idx ON upgrades (build_id);
    CREATE INDEX upgrades_episode_idx ON upgrades (episode_id);

    CREATE TABLE upgrade_prerequisites (
      build_id        INTEGER NOT NULL,
      upgrade_id      INTEGER NOT NULL,
      prerequisite_id INTEGER NOT NULL,
      PRIMARY KEY (upgrade_id, prerequisite_id),
      CONSTRAINT prerequisite_not_self CHECK (upgrade_id <> prerequisite_id),
      CONSTRAINT prerequisite_upgrade_same_build FOREIGN KEY (build_id, upgrade_id)
        REFERENCES upgrades (build_id, id) ON DELETE CASCADE,
      CONSTRAINT prerequisite_target_same_build FOREIGN KEY (build_id, prerequisite_id)
        REFERENCES upgrades (build_id, id) ON DELETE RESTRICT
    );
    CREATE INDEX upgrade_prerequisites_build_idx ON upgrade_prerequisites (build_id);
    CREATE INDEX upgrade_prerequisites_prereq_idx ON upgrade_prerequisites (prerequisite_id);

    CREATE TABLE parts (
      id                  SERIAL PRIMARY KEY,
      build_id            INTEGER NOT NULL,
      upgrade_id          INTEGER NOT NULL,
      part_number         TEXT NOT NULL CHECK (length(part_number) BETWEEN 1 AND 60),
      description         TEXT NOT NULL CHECK (length(description) BETWEEN 1 AND 200),
      quantity            INTEGER NOT NULL DEFAULT 1 CHECK (quantity > 0 AND quantity <= 10000),
      unit_cost_cents     INTEGER NOT NULL DEFAULT 0 CHECK (unit_cost_cents >= 0),
      retail_price_cents  INTEGER CHECK (retail_price_cents IS NULL OR retail_price_cents >= 0),
      supplier            TEXT CHECK (supplier IS NULL OR length(supplier) <= 120),
      condition           TEXT NOT NULL DEFAULT 'new' CHECK (condition IN ('new','take_off')),
      product_url         TEXT CHECK (product_url IS NULL OR (product_url ${HTTP_URL} AND length(product_url) <= 2000)),
      expected_arrival    DATE,
      ordered_on          DATE,
      received_on         DATE,
      state               TEXT NOT NULL DEFAULT 'to_order'
                          CHECK (state IN ('to_order','ordered','backordered','received','fitted','returned')),
      version             INTEGER NOT NULL DEFAULT 0,
      created_at          TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at          TIMESTAMPTZ NOT NULL DEFAULT now(),
      CONSTRAINT parts_upgrade_same_build FOREIGN KEY (build_id, upgrade_id)
        REFERENCES upgrades (build_id, id) ON DELETE CASCADE
    );
    CREATE INDEX parts_build_idx ON parts (build_id);
    CREATE INDEX parts_upgrade_idx ON parts (upgrade_id);

    CREATE TABLE removed_parts (
      id                  SERIAL PRIMARY KEY,
      build_id            INTEGER NOT NULL REFERENCES builds(id) ON DELETE CASCADE,
      upgrade_id          INTEGER,
      description         TEXT NOT NULL CHECK (length(description) BETWEEN 1 AND 200),
      part_number         TEXT CHECK (part_number IS NULL OR length(part_number) <= 60),
      disposition         TEXT NOT NULL DEFAULT 'keep' CHECK (disposition IN ('keep','for_sale','sold','scrapped')),
      expected_sale_cents INTEGER CHECK (expected_sale_cents IS NULL OR expected_sale_cents >= 0),
      actual_sale_cents   INTEGER CHECK (actual_sale_cents IS NULL OR actual_sale_cents >= 0),
      sold_on             DATE,
      created_at          TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at          TIMESTAMPTZ NOT NULL DEFAULT now(),
      CONSTRAINT removed_parts_upgrade_same_build FOREIGN KEY (build_id, upgrade_id)
        REFERENCES upgrades (build_id, id) ON DELETE SET NULL (upgrade_id)
    );
    CREATE INDEX removed_parts_build_idx ON removed_parts (build_id);

    CREATE TABLE labour_entries (
      id           SERIAL PRIMARY KEY,
      build_id     INTEGER NOT NULL,
      upgrade_id   INTEGER NOT NULL,
      user_id      INTEGER REFERENCES users(id) ON DELETE SET NULL,
      person_name  TEXT NOT NULL CHECK (length(person_name) BETWEEN 1 AND 120),
      worked_on    DATE NOT NULL,
      hours        DOUBLE PRECISION NOT NULL CHECK (hours > 0 AND hours <= 24),
      kind         TEXT NOT NULL DEFAULT 'install' CHECK (kind IN ('install','filming','prep')),
      note         TEXT CHECK (note IS NULL OR length(note) <= 500),
      created_at   TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at   TIMESTAMPTZ NOT NULL DEFAULT now(),
      CONSTRAINT labour_upgrade_same_build FOREIGN KEY (build_id, upgrade_id)
        REFERENCES upgrades (build_id, id) ON DELETE CASCADE
    );
    CREATE INDEX labour_entries_build_idx ON labour_entries (build_id);
    CREATE INDEX labour_entries_upgrade_idx ON labour_entries (upgrade_id);

    CREATE TABLE expenses (
      id           SERIAL PRIMARY KEY,
      build_id     INTEGER NOT NULL REFERENCES builds(id) ON DELETE CASCADE,
      upgrade_id   INTEGER,
      description  TEXT NOT NULL CHECK (length(description) BETWEEN 1 AND 200),
      amount_cents INTEGER NOT NULL CHECK (amount_cents >= 0),
      spent_on     DATE NOT NULL,
      category     TEXT CHECK (category IS NULL OR length(category) <= 60),
      created_at   TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at   TIMESTAMPTZ NOT NULL DEFAULT now(),
      CONSTRAINT expenses_upgrade_same_build FOREIGN KEY (build_id, upgrade_id)
        REFERENCES upgrades (build_id, id) ON DELETE SET NULL (upgrade_id)
    );
    CREATE INDEX expenses_build_idx ON expenses (build_id);

    CREATE TABLE episode_chapters (
      id             SERIAL PRIMARY KEY,
      episode_id     INTEGER NOT NULL REFERENCES episodes(id) ON DELETE CASCADE,
      position       INTEGER NOT NULL CHECK (position >= 0),
      start_seconds  INTEGER NOT NULL CHECK (start_seconds >= 0),
      title          TEXT NOT NULL CHECK (length(title) BETWEEN 1 AND 100),
      upgrade_id     INTEGER REFERENCES upgrades(id) ON DELETE SET NULL,
      UNIQUE (episode_id, position)
    );

    -- Append-only: who changed what, when, from what to what. No foreign key to builds so the
    -- record outlives what it describes.
    CREATE TABLE activities (
      id          BIGSERIAL PRIMARY KEY,
      build_id    INTEGER,
      user_id     INTEGER,
      user_name   TEXT,
      entity      TEXT NOT NULL,
      entity_id   INTEGER,
      action      TEXT NOT NULL,
      summary     TEXT NOT NULL,
      changes     JSONB NOT NULL DEFAULT '{}',
      created_at  TIMESTAMPTZ NOT NULL DEFAULT now()
    );
    CREATE INDEX activities_build_idx ON activities (build_id, created_at DESC);
    CREATE INDEX activities_entity_idx ON activities (entity, entity_id);
    CREATE FUNCTION activities_append_only() RETURNS trigger AS $$
      BEGIN RAISE EXCEPTION 'activities are append-only'; END;
    $$ LANGUAGE plpgsql;
    CREATE TRIGGER activities_no_change BEFORE UPDATE OR DELETE ON activities
      FOR EACH ROW EXECUTE FUNCTION activities_append_only();
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    DROP TABLE activities; DROP FUNCTION activities_append_only();
    DROP TABLE episode_chapters; DROP TABLE expenses; DROP TABLE labour_entries; DROP TABLE removed_parts;
    DROP TABLE parts; DROP TABLE upgrade_prerequisites; DROP TABLE upgrades; DROP TABLE episodes; DROP TABLE builds;
  `);
}
