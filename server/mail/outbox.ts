// Putting mail on the queue. Callers pass their transaction, so a mail exists exactly when the
// change that caused it was committed; the worker sends it later.
import type { Transaction } from 'sequelize';
import { sequelize } from '../models';

export interface OutgoingMail {
  kind: string;
  to: string;
  subject: string;
  text: string;
  headers?: Record<string, string>;
  /** At most one mail per key, ever (a second enqueue with the same key is ignored). */
  dedupeKey?: string;
  /** Blank the address and body once sent (they hold data we may not keep). */
  scrubAfterSend?: boolean;
}

/** Queues a mail; returns false when a mail with the same dedupe key already exists. */
export async function enqueueMail(t: Transaction | null, mail: OutgoingMail): Promise<boolean> {
  const [rows] = await sequelize.query(
    `INSERT INTO mail_outbox (kind, to_address, subject, text_body, headers, dedupe_key, scrub_after_send)
     VALUES (:kind, :to, :subject, :text, :headers::jsonb, :dedupeKey, :scrub)
     ON CONFLICT (dedupe_key) DO NOTHING RETURNING id`,
    {
      replacements: {
        kind: mail.kind,
        to: mail.to,
        subject: mail.subject,
        text: mail.text,
        headers: JSON.stringify(mail.headers ?? {}),
        dedupeKey: mail.dedupeKey ?? null,
        scrub: mail.scrubAfterSend ?? false,
      },
      transaction: t ?? undefined,
    },
  );
  return (rows as unknown[]).length > 0;
}
