// Sends queued mail outside any request. A mail is first claimed in a short statement of its own
// (FOR UPDATE SKIP LOCKED picks a row no other worker is claiming; claimed_until keeps it ours for
// MAIL_CLAIM_SECONDS), then handed to SMTP with no transaction open and no row locked, then its
// outcome is recorded. A worker that dies mid-send leaves a claim that runs out, and the mail is
// sent again: at least once, always with the same Message-ID (built from its queue id), so a
// repeat is recognisable downstream. A failure schedules a retry with exponential backoff; after
// MAIL_MAX_ATTEMPTS the mail is marked failed, and the owner can send it again.
import { randomUUID } from 'node:crypto';
import type { Transporter } from 'nodemailer';
import { QueryTypes } from 'sequelize';
import { sequelize } from '../models';
import { config } from '../config';
import { mailDomain, mailTransport } from './transport';

interface Row {
  id: string;
  to_address: string;
  subject: string;
  text_body: string;
  headers: Record<string, string>;
  attempts: number;
  scrub_after_send: boolean;
}

const MAX_BACKOFF_MS = 6 * 3_600_000;

/** Delay before the next attempt after `attempts` failures: base × 2^(attempts−1), capped at 6 h. */
export function backoffMs(attempts: number, base = config().MAIL_RETRY_BASE_MS) {
  return Math.min(base * 2 ** Math.max(0, attempts - 1), MAX_BACKOFF_MS);
}

type Outcome = 'none' | 'sent' | 'retry' | 'failed';

/** Takes the next due mail for this worker, in one short statement; null when none is due. */
async function claimNext(): Promise<(Row & { claim_id: string }) | null> {
  const rows = await sequelize.query<Row & { claim_id: string }>(
    `UPDATE mail_outbox SET claimed_until = now() + make_interval(secs => :secs), claim_id = :claim
     WHERE id = (
       SELECT id FROM mail_outbox
       WHERE state = 'queued' AND next_attempt_at <= now() AND (claimed_until IS NULL OR claimed_until < now())
       ORDER BY next_attempt_at, id LIMIT 1 FOR UPDATE SKIP LOCKED)
     RETURNING id, to_address, subject, text_body, headers, attempts, scrub_after_send, claim_id`,
    { replacements: { secs: config().MAIL_CLAIM_SECONDS, claim: randomUUID() }, type: QueryTypes.SELECT },
  );
  return rows[0] ?? null;
}

async function sendOne(transport: Transporter): Promise<Outcome> {
  const row = await claimNext();
  if (!row) return 'none';
  try {
    await transport.sendMail({
      from: config().MAIL_FROM,
      to: row.to_address,
      subject: row.subject,
      text: row.text_body,
      headers: row.headers,
      messageId: `<outbox-${row.id}@${mailDomain()}>`,
    });
  } catch (err) {
    const attempts = row.attempts + 1;
    const failed = attempts >= config().MAIL_MAX_ATTEMPTS;
    // Only while the claim is still ours: a worker that took over an expired claim decides instead.
    await sequelize.query(
      `UPDATE mail_outbox SET attempts = :attempts, last_error = :error, claimed_until = NULL, claim_id = NULL,
         state = CASE WHEN :failed THEN 'failed' ELSE 'queued' END,
         next_attempt_at = now() + (:delay || ' milliseconds')::interval
       WHERE id = :id AND claim_id = :claim AND state = 'queued'`,
      {
        replacements: {
          id: row.id,
          claim: row.claim_id,
          attempts,
          error: String((err as Error)?.message ?? err).slice(0, 500),
          failed,
          delay: String(backoffMs(attempts)),
        },
      },
    );
    return failed ? 'failed' : 'retry';
  }
  // Sent is sent, whoever holds the claim now.
  await sequelize.query(
    `UPDATE mail_outbox SET state = 'sent', sent_at = now(), attempts = attempts + 1, last_error = NULL, claimed_until = NULL, claim_id = NULL,
       to_address = CASE WHEN scrub_after_send THEN NULL ELSE to_address END,
       text_body = CASE WHEN scrub_after_send THEN '(removed after sending)' ELSE text_body END
     WHERE id = :id AND state = 'queued'`,
    { replacements: { id: row.id } },
  );
  return 'sent';
}

/** Sends every mail that is due (up to `limit`); returns how many were sent and how many failed. */
export async function processDueMail(opts: { transport?: Transporter | null; limit?: number } = {}) {
  const transport = opts.transport ?? mailTransport();
  const result = { sent: 0, retry: 0, failed: 0 };
  if (!transport) return result;
  for (let i = 0; i < (opts.limit ?? 50); i++) {
    // A stopping server lets the worker finish the mail in hand, and takes no further one.
    if (finishing) break;
    const outcome = await sendOne(transport);
    if (outcome === 'none') break;
    result[outcome] += 1;
  }
  return result;
}

/**
 * Forgets votes nobody confirmed: a day after their link expired the pending vote goes, and a
 * request that was never confirmed goes once it has no pending vote left.
 */
export async function pruneUnconfirmed() {
  await sequelize.query(
    `DELETE FROM viewer_votes WHERE confirmed_at IS NULL AND expires_at < now() - interval '1 day'`,
  );
  await sequelize.query(
    `DELETE FROM viewer_requests r WHERE r.confirmed_at IS NULL AND r.created_at < now() - interval '1 day'
       AND NOT EXISTS (SELECT 1 FROM viewer_votes v WHERE v.request_id = r.id)`,
  );
}

let timer: NodeJS.Timeout | null = null;
let running: Promise<unknown> | null = null;
let stopped = true;

/** Polls the queue every MAIL_POLL_MS until stopMailWorker(). */
export function startMailWorker() {
  if (!stopped) return;
  stopped = false;
  const tick = () => {
    if (stopped) return;
    running = processDueMail()
      .then(() => pruneUnconfirmed())
      .catch((err) => console.error('[mail] worker pass failed:', err?.message ?? err))
      .finally(() => {
        running = null;
        if (!stopped) timer = setTimeout(tick, config().MAIL_POLL_MS);
      });
  };
  tick();
}

let finishing = false;

export async function stopMailWorker() {
  stopped = true;
  if (timer) clearTimeout(timer);
  timer = null;
  finishing = true;
  await running;
  finishing = false;
}
