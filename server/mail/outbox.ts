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

/** How many mails used up their attempts and wait for the owner (the ready check reports it). */
export async function countFailedMails(): Promise<number> {
  const [rows] = await sequelize.query(`SELECT count(*)::int AS n FROM mail_outbox WHERE state = 'failed'`);
  return (rows as { n: number }[])[0]?.n ?? 0;
}

export interface FailedMail {
  id: number;
  kind: string;
  /** The address; a viewer's (not yet confirmed) address is shown only in part. */
  to: string;
  subject: string;
  attempts: number;
  lastError: string | null;
  createdAt: string;
}

/** Shows a@example.com as a…@example.com: enough to recognise, not to collect. */
export const maskAddress = (a: string) => a.replace(/^(.)[^@]*(@.*)$/, '$1…$2');

/** The newest failed mails first (at most 100). */
export async function listFailedMails(): Promise<FailedMail[]> {
  const [rows] = await sequelize.query(
    `SELECT id::int AS id, kind, to_address, subject, attempts, last_error, created_at, scrub_after_send
     FROM mail_outbox WHERE state = 'failed' ORDER BY created_at DESC, id DESC LIMIT 100`,
  );
  return (
    rows as {
      id: number;
      kind: string;
      to_address: string | null;
      subject: string;
      attempts: number;
      last_error: string | null;
      created_at: Date;
      scrub_after_send: boolean;
    }[]
  ).map((r) => ({
    id: r.id,
    kind: r.kind,
    to: r.to_address ? (r.scrub_after_send ? maskAddress(r.to_address) : r.to_address) : '(removed)',
    subject: r.subject,
    attempts: r.attempts,
    lastError: r.last_error,
    createdAt: new Date(r.created_at).toISOString(),
  }));
}

/** Puts a failed mail back on the queue with fresh attempts; false when it is not a failed mail. */
export async function resendMail(id: number, t?: Transaction): Promise<boolean> {
  const [rows] = await sequelize.query(
    `UPDATE mail_outbox SET state = 'queued', attempts = 0, next_attempt_at = now(), claimed_until = NULL, claim_id = NULL
     WHERE id = :id AND state = 'failed' AND to_address IS NOT NULL RETURNING id`,
    { replacements: { id }, transaction: t },
  );
  return (rows as unknown[]).length > 0;
}
