// Viewer requests and their e-mail-confirmed votes, the outgoing mail queue, and unsubscribes.
// Privacy is a constraint here: a vote holds a plain e-mail address only once it is confirmed.
import type { MigrationContext } from '../migrate';

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(`
    CREATE TABLE viewer_requests (
      id              SERIAL PRIMARY KEY,
      build_id        INTEGER NOT NULL REFERENCES builds(id) ON DELETE CASCADE,
      title           TEXT NOT NULL CHECK (length(title) BETWEEN 3 AND 140),
      details         TEXT CHECK (details IS NULL OR length(details) <= 2000),
      state           TEXT NOT NULL DEFAULT 'new' CHECK (state IN ('new','accepted','declined','merged')),
      upgrade_id      INTEGER,
      merged_into_id  INTEGER,
      decline_reason  TEXT CHECK (decline_reason IS NULL OR length(decline_reason) BETWEEN 1 AND 500),
      -- Set when the first vote (the requester's own) is confirmed; unconfirmed requests stay hidden.
      confirmed_at    TIMESTAMPTZ,
      created_at      TIMESTAMPTZ NOT NULL DEFAULT now(),
      updated_at      TIMESTAMPTZ NOT NULL DEFAULT now(),
      CONSTRAINT viewer_requests_build_id_id_key UNIQUE (build_id, id),
      CONSTRAINT viewer_requests_upgrade_same_build FOREIGN KEY (build_id, upgrade_id)
        REFERENCES upgrades (build_id, id) ON DELETE SET NULL (upgrade_id),
      CONSTRAINT viewer_requests_merge_same_build FOREIGN KEY (build_id, merged_into_id)
        REFERENCES viewer_requests (build_id, id) ON DELETE SET NULL (merged_into_id),
      CONSTRAINT viewer_requests_not_merged_into_self CHECK (merged_into_id IS NULL OR merged_into_id <> id),
      CONSTRAINT viewer_requests_merged_has_target CHECK (state <> 'merged' OR merged_into_id IS NOT NULL),
      CONSTRAINT viewer_requests_declined_has_reason CHECK (state <> 'declined' OR decline_reason IS NOT NULL)
    );
    CREATE INDEX viewer_requests_build_idx ON viewer_requests (build_id, state);
    CREATE INDEX viewer_requests_upgrade_idx ON viewer_requests (upgrade_id);

    CREATE TABLE viewer_votes (
      id                 SERIAL PRIMARY KEY,
      request_id         INTEGER NOT NULL REFERENCES viewer_requests(id) ON DELETE CASCADE,
      -- Keyed hash of the normalised address: counts one vote per person without keeping the address.
      email_hash         TEXT NOT NULL CHECK (length(email_hash) = 64),
      -- The address sealed with a key derived from the confirmation token (which only the mail holds).
      email_sealed       TEXT,
      email              TEXT CHECK (email IS NULL OR (email = lower(email) AND length(email) <= 254)),
      name               TEXT CHECK (name IS NULL OR length(name) BETWEEN 1 AND 80),
      confirm_token_hash TEXT NOT NULL UNIQUE CHECK (length(confirm_token_hash) = 64),
      expires_at         TIMESTAMPTZ NOT NULL,
      confirmed_at       TIMESTAMPTZ,
      created_at         TIMESTAMPTZ NOT NULL DEFAULT now(),
      CONSTRAINT viewer_votes_email_only_confirmed CHECK (email IS NULL OR confirmed_at IS NOT NULL),
      CONSTRAINT viewer_votes_sealed_only_pending CHECK (email_sealed IS NULL OR confirmed_at IS NULL)
    );
    CREATE UNIQUE INDEX viewer_votes_once_per_person ON viewer_votes (request_id, email_hash) WHERE confirmed_at IS NOT NULL;
    CREATE INDEX viewer_votes_request_idx ON viewer_votes (request_id);

    CREATE TABLE unsubscribes (
      email_hash  TEXT PRIMARY KEY CHECK (length(email_hash) = 64),
      created_at  TIMESTAMPTZ NOT NULL DEFAULT now()
    );

    -- Outgoing mail. Requests only insert here; a worker sends outside the request, with retries.
    CREATE TABLE mail_outbox (
      id               BIGSERIAL PRIMARY KEY,
      kind             TEXT NOT NULL CHECK (length(kind) BETWEEN 1 AND 40),
      to_address       TEXT,
      subject          TEXT NOT NULL CHECK (length(subject) BETWEEN 1 AND 300),
      text_body        TEXT NOT NULL,
      headers          JSONB NOT NULL DEFAULT '{}',
      -- One mail per purpose (e.g. one "it is live" mail per person per episode).
      dedupe_key       TEXT UNIQUE,
      -- Confirmation mails carry an address we may not keep: blank it once sent.
      scrub_after_send BOOLEAN NOT NULL DEFAULT FALSE,
      state            TEXT NOT NULL DEFAULT 'queued' CHECK (state IN ('queued','sent','failed')),
      attempts         INTEGER NOT NULL DEFAULT 0 CHECK (attempts >= 0),
      next_attempt_at  TIMESTAMPTZ NOT NULL DEFAULT now(),
      last_error       TEXT,
      sent_at          TIMESTAMPTZ,
      created_at       TIMESTAMPTZ NOT NULL DEFAULT now(),
      CONSTRAINT mail_outbox_queued_has_address CHECK (state <> 'queued' OR to_address IS NOT NULL),
      CONSTRAINT mail_outbox_sent_has_time CHECK (state <> 'sent' OR sent_at IS NOT NULL)
    );
    CREATE INDEX mail_outbox_due_idx ON mail_outbox (next_attempt_at) WHERE state = 'queued';
  `);
}

export async function down({ context: { sequelize } }: { context: MigrationContext }) {
  await sequelize.query(
    `DROP TABLE mail_outbox; DROP TABLE unsubscribes; DROP TABLE viewer_votes; DROP TABLE viewer_requests;`,
  );
}
