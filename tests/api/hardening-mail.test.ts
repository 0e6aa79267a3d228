// Outgoing mail under issue 10: the worker holds no transaction or row lock while SMTP talks, an
// expired claim is picked up again, failed mails reach the owner who can send them again, and a
// confirmation mail's subject carries no viewer text.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { SMTPServer } from 'smtp-server';
import type { AddressInfo } from 'node:net';
import pg from 'pg';
import { QueryTypes } from 'sequelize';
import { anonymous, signInAs } from '../helpers/api';
import { sequelize } from '../../server/models';
import { config } from '../../server/config';
import { enqueueMail, countFailedMails } from '../../server/mail/outbox';
import { processDueMail } from '../../server/mail/worker';
import { fakeTransport } from '../../server/mail/transport';

interface Received {
  messageId: string;
  raw: string;
}
/** A fake SMTP server that waits `delayMs` before accepting each message, and says when one starts. */
async function slowSmtp(delayMs: number) {
  const received: Received[] = [];
  let onStart: (() => void) | null = null;
  const server = new SMTPServer({
    disabledCommands: ['STARTTLS'],
    authOptional: true,
    logger: false,
    onData(stream, _s, cb) {
      const chunks: Buffer[] = [];
      onStart?.();
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        const raw = Buffer.concat(chunks).toString('utf8');
        received.push({ raw, messageId: /^Message-ID: (.*)$/im.exec(raw)?.[1]?.trim() ?? '' });
        setTimeout(() => cb(), delayMs);
      });
    },
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  const port = (server.server.address() as AddressInfo).port;
  return {
    port,
    received,
    started: () => new Promise<void>((r) => (onStart = r)),
    stop: () => new Promise<void>((r) => server.close(() => r())),
  };
}

const stateOf = async (id: number) =>
  (
    await sequelize.query<{ state: string; attempts: number; claimed_until: Date | null }>(
      `SELECT state, attempts, claimed_until FROM mail_outbox WHERE id = :id`,
      { replacements: { id }, type: QueryTypes.SELECT },
    )
  )[0]!;
async function queue(to: string, subject: string) {
  await enqueueMail(null, { kind: 'test', to, subject, text: 'Hello from the bay.' });
  return (
    await sequelize.query<{ id: number }>(
      `SELECT id::int AS id FROM mail_outbox WHERE to_address = :to ORDER BY id DESC LIMIT 1`,
      { replacements: { to }, type: QueryTypes.SELECT },
    )
  )[0]!.id;
}

let smtp: Awaited<ReturnType<typeof slowSmtp>>;
let other: pg.Client;
beforeAll(async () => {
  smtp = await slowSmtp(1500);
  other = new pg.Client({ connectionString: config().DATABASE_URL });
  await other.connect();
  // Only this file's mails: the seed's queue is not part of these checks.
  await sequelize.query(`UPDATE mail_outbox SET state = 'sent', sent_at = now() WHERE state = 'queued'`);
});
afterAll(async () => {
  await other.end();
  await smtp.stop();
});

describe('the mail worker and the database', () => {
  it('holds no transaction and no row lock while the SMTP server takes its time', async () => {
    const id = await queue('slow@crew.test', 'Slow server');
    const started = smtp.started();
    const sending = processDueMail({ transport: fakeTransport(smtp.port) });
    await started;
    // The row can be locked by anyone else at once (NOWAIT fails if a worker holds it).
    await other.query('BEGIN');
    const locked = await other.query('SELECT id FROM mail_outbox WHERE id = $1 FOR UPDATE NOWAIT', [id]);
    await other.query('ROLLBACK');
    expect(locked.rowCount).toBe(1);
    const open = await other.query(
      `SELECT count(*)::int AS n FROM pg_stat_activity WHERE datname = current_database() AND state LIKE 'idle in transaction%'`,
    );
    expect(open.rows[0].n).toBe(0);
    // The mail is claimed: a second worker meanwhile does not send it too.
    const second = await processDueMail({ transport: fakeTransport(smtp.port) });
    expect(second.sent).toBe(0);
    expect((await stateOf(id)).claimed_until).not.toBeNull();
    expect(await sending).toMatchObject({ sent: 1 });
    expect(await stateOf(id)).toMatchObject({ state: 'sent', attempts: 1, claimed_until: null });
    expect(smtp.received.filter((m) => m.messageId === `<outbox-${id}@bayslate.test>`)).toHaveLength(1);
  });

  it('a claim that ran out (a crashed worker) is picked up again, with the same Message-ID', async () => {
    const id = await queue('crashed@crew.test', 'After a crash');
    await sequelize.query(
      `UPDATE mail_outbox SET claimed_until = now() - interval '1 second', claim_id = gen_random_uuid() WHERE id = :id`,
      { replacements: { id } },
    );
    const fresh = await queue('claimed@crew.test', 'Still claimed');
    await sequelize.query(
      `UPDATE mail_outbox SET claimed_until = now() + interval '1 minute', claim_id = gen_random_uuid() WHERE id = :id`,
      { replacements: { id: fresh } },
    );
    expect(await processDueMail({ transport: fakeTransport(smtp.port) })).toMatchObject({ sent: 1 });
    expect((await stateOf(id)).state).toBe('sent');
    expect((await stateOf(fresh)).state).toBe('queued');
    expect(smtp.received.some((m) => m.messageId === `<outbox-${id}@bayslate.test>`)).toBe(true);
    await sequelize.query(`UPDATE mail_outbox SET state = 'sent', sent_at = now() WHERE id = :id`, {
      replacements: { id: fresh },
    });
  });
});

describe('failed mails', () => {
  it('a mail that used up its attempts is counted, listed for the owner, and sent again on request', async () => {
    const id = await queue('bounce@crew.test', 'Will fail');
    await sequelize.query(`UPDATE mail_outbox SET attempts = :n WHERE id = :id`, {
      replacements: { id, n: config().MAIL_MAX_ATTEMPTS - 1 },
    });
    const failedBefore = await countFailedMails();
    // Port 9 on loopback: nothing listens, the connection is refused.
    expect(await processDueMail({ transport: fakeTransport(9) })).toMatchObject({ failed: 1 });
    expect(await countFailedMails()).toBe(failedBefore + 1);
    // The ready check counts it (its answer is reused for about a second, so ask after that).
    await new Promise((r) => setTimeout(r, 1100));
    const ready = await anonymous().get('/api/health/ready');
    expect(ready.body.failedMails).toBe(failedBefore + 1);

    const owner = await signInAs('owner');
    const list = await owner.get('/api/mail/failed');
    expect(list.status).toBe(200);
    expect(list.body.mails.find((m: { id: number }) => m.id === id)).toMatchObject({
      to: 'bounce@crew.test',
      subject: 'Will fail',
      attempts: config().MAIL_MAX_ATTEMPTS,
    });
    expect((await (await signInAs('producer')).post(`/api/mail/${id}/resend`).send({})).status).toBe(403);

    const again = await owner.post(`/api/mail/${id}/resend`).send({});
    expect(again.status).toBe(200);
    expect(await stateOf(id)).toMatchObject({ state: 'queued', attempts: 0 });
    expect((await owner.post(`/api/mail/${id}/resend`).send({})).status).toBe(404);
    expect(await processDueMail({ transport: fakeTransport(smtp.port) })).toMatchObject({ sent: 1 });
    expect((await stateOf(id)).state).toBe('sent');
    expect(await countFailedMails()).toBe(failedBefore);
  });

  it("a viewer's unconfirmed address is shown only in part", async () => {
    await enqueueMail(null, {
      kind: 'vote_confirm',
      to: 'private.viewer@viewers.test',
      subject: 'Confirm',
      text: 'x',
      scrubAfterSend: true,
    });
    await sequelize.query(`UPDATE mail_outbox SET state = 'failed' WHERE to_address = 'private.viewer@viewers.test'`);
    const list = await (await signInAs('owner')).get('/api/mail/failed');
    const row = list.body.mails.find((m: { kind: string }) => m.kind === 'vote_confirm');
    expect(row.to).toBe('p…@viewers.test');
    expect(JSON.stringify(list.body)).not.toContain('private.viewer');
  });
});

describe('confirmation mails', () => {
  it('carry a fixed subject; the viewer text is only in the body, on one quoted line, links broken', async () => {
    const title = 'Free parts at http://win.example\nReply with your card';
    const res = await anonymous()
      .post('/api/public/builds/project-tern/requests')
      .send({ title, email: 'subject-test@viewers.test' });
    expect(res.status).toBe(202);
    const [mail] = await sequelize.query<{ subject: string; text_body: string }>(
      `SELECT subject, text_body FROM mail_outbox WHERE to_address = 'subject-test@viewers.test'`,
      { type: QueryTypes.SELECT },
    );
    expect(mail!.subject).toBe('Confirm your vote on the Project Tern build');
    expect(mail!.text_body).toContain('“Free parts at http[:]//win.example Reply with your card”');
    expect(mail!.text_body).not.toContain('http://win.example');
  });
});
