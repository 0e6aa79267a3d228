// Viewers' address hashes move from a key derived from the session secret to one derived from
// VIEWER_KEY_SECRET. Rows that still hold the address are hashed again; each old hash that had a
// new one is remembered, so an unsubscribe link mailed before the change (it names the old hash)
// still stops the mail: a trigger records the new hash in its place and forgets the address.
import type { Sequelize } from 'sequelize';
import { QueryTypes } from 'sequelize';
import type { MigrationContext } from '../migrate';
import { emailHash } from '../../services/viewerPrivacy';

/** Hashes every kept address with the current key; returns how many addresses moved. */
export async function rekeyViewerHashes(sequelize: Sequelize): Promise<number> {
  return sequelize.transaction(async (t) => {
    const rows = await sequelize.query<{ email_hash: string; email: string }>(
      `SELECT DISTINCT email_hash, email FROM viewer_votes WHERE email IS NOT NULL`,
      { type: QueryTypes.SELECT, transaction: t },
    );
    let moved = 0;
    for (const r of rows) {
      const next = emailHash(r.email);
      if (next === r.email_hash) continue;
      moved += 1;
      const replacements = { old: r.email_hash, next, email: r.email };
      await sequelize.query(
        `INSERT INTO viewer_key_rekeys (old_hash, new_hash) VALUES (:old, :next) ON CONFLICT (old_hash) DO UPDATE SET new_hash = EXCLUDED.new_hash`,
        { replacements, transaction: t },
      );
      await sequelize.query(`UPDATE viewer_votes SET email_hash = :next WHERE email_hash = :old`, {
        replacements,
        transaction: t,
      });
      await sequelize.query(
        `INSERT INTO unsubscribes (email_hash) SELECT :next WHERE EXISTS (SELECT 1 FROM unsubscribes WHERE email_hash = :old) ON CONFLICT DO NOTHING`,
        { replacements, transaction: t },
      );
      await sequelize.query(
        `UPDATE mail_outbox SET dedupe_key = regexp_replace(dedupe_key, ':' || :old || '$', ':' || :next) WHERE dedupe_key LIKE 'live:%:' || :old`,
        { replacements, transaction: t },
      );
    }
    return moved;
  });
}

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE viewer_key_rekeys (
      old_hash TEXT PRIMARY KEY CHECK (length(old_hash) = 64),
      new_hash TEXT NOT NULL CHECK (length(new_hash) = 64)
    );
    CREATE FUNCTION unsubscribes_use_current_hash() RETURNS trigger AS $$
      DECLARE current_hash TEXT;
      BEGIN
        SELECT new_hash INTO current_hash FROM viewer_key_rekeys WHERE old_hash = NEW.email_hash;
        IF FOUND THEN
          UPDATE viewer_votes SET email = NULL WHERE email_hash = current_hash;
          NEW.email_hash := current_hash;
        END IF;
        RETURN NEW;
      END;
    $$ LANGUAGE plpgsql;
    CREATE TRIGGER unsubscribes_use_current_hash BEFORE INSERT ON unsubscribes
      FOR EACH ROW EXECUTE FUNCTION unsubscribes_use_current_hash();
  `);
  await rekeyViewerHashes(sequelize);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(
    `DROP TRIGGER unsubscribes_use_current_hash ON unsubscribes; DROP FUNCTION unsubscribes_use_current_hash(); DROP TABLE viewer_key_rekeys;`,
  );
}
