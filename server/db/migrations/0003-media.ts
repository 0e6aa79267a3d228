// Media: photos, footage and documents kept in object storage, one row per stored object
// (plus its thumbnail). Attachments stay inside their build through composite foreign keys.
import type { MigrationContext } from '../migrate';

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    -- Parts had no (build_id, id) key for a same-build reference to point at.
    ALTER TABLE parts ADD CONSTRAINT parts_build_id_id_key UNIQUE (build_id, id);

    CREATE TABLE media (
      id             SERIAL PRIMARY KEY,
      build_id       INTEGER NOT NULL REFERENCES builds(id) ON DELETE CASCADE,
      upgrade_id     INTEGER,
      episode_id     INTEGER,
      part_id        INTEGER,
      kind           TEXT NOT NULL CHECK (kind IN ('photo','video','document')),
      stage          TEXT CHECK (stage IS NULL OR stage IN ('before','during','after')),
      caption        TEXT CHECK (caption IS NULL OR length(caption) <= 500),
      object_key     TEXT NOT NULL UNIQUE CHECK (length(object_key) BETWEEN 1 AND 300),
      thumb_key      TEXT UNIQUE CHECK (thumb_key IS NULL OR length(thumb_key) BETWEEN 1 AND 300),
      original_name  TEXT NOT NULL CHECK (length(original_name) BETWEEN 1 AND 255),
      content_type   TEXT NOT NULL CHECK (length(content_type) BETWEEN 3 AND 100),
      size_bytes     BIGINT NOT NULL CHECK (size_bytes > 0),
      sha256         TEXT NOT NULL CHECK (sha256 ~ '^[0-9a-f]{64}$'),
      uploaded_by    INTEGER REFERENCES users(id) ON DELETE SET NULL,
      created_at     TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at     TIMESTAMPTZ NOT NULL DEFAULT now(),
      CONSTRAINT media_upgrade_same_build FOREIGN KEY (build_id, upgrade_id)
        REFERENCES upgrades (build_id, id) ON DELETE SET NULL (upgrade_id),
      CONSTRAINT media_episode_same_build FOREIGN KEY (build_id, episode_id)
        REFERENCES episodes (build_id, id) ON DELETE SET NULL (episode_id),
      CONSTRAINT media_part_same_build FOREIGN KEY (build_id, part_id)
        REFERENCES parts (build_id, id) ON DELETE SET NULL (part_id)
    );
    CREATE INDEX media_build_idx ON media (build_id, created_at DESC);
    CREATE INDEX media_upgrade_idx ON media (upgrade_id);
    CREATE INDEX media_episode_idx ON media (episode_id);
    CREATE INDEX media_part_idx ON media (part_id);
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`DROP TABLE media; ALTER TABLE parts DROP CONSTRAINT parts_build_id_id_key;`);
}
