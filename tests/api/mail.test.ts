// The mail queue and worker (server/mail/): sent once, retried with backoff when SMTP is down,
// never sent twice by two workers, the 'mail' health check, the invitation mail and /dev/mail.
import { describe, it, expect } from 'vitest';
import net from 'node:net';
import type { Transporter } from 'nodemailer';
import { anonymous, signInAs } from '../helpers/api';
import { count } from '../helpers/db';
import { mailsTo, linkIn, uniqueAddress } from '../helpers/mailbox';
import { sequelize, MailOutbox } from '../../server/models';
import { enqueueMail } from '../../server/mail/outbox';
import { processDueMail, backoffMs } from '../../server/mail/worker';
import { fakeTransport, mailTransport } from '../../server/mail/transport';
import { config } from '../../server/config';
import { everyAnswerHasAContract } from '../helpers/contract';

// /api/health is another domain's (its contract comes with it).
everyAnswerHasAContract({ except: ['/api/health'] });

async function closedPort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer();
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

const queue = (to: string, extra: Partial<Parameters<typeof enqueueMail>[1]> = {}) =>
  enqueueMail(null, {
    kind: 'test',
    to,
    subject: `Hello ${to}`,
    text: 'Body with a link https://example.test/x',
    ...extra,
  });

describe('mail queue and worker', () => {
  it('sends a queued mail exactly once and records it', async () => {
    const to = uniqueAddress('once');
    await queue(to);
    const first = await processDueMail();
    expect(first.sent).toBeGreaterThanOrEqual(1);
    expect((await processDueMail()).sent).toBe(0);
    const mails = await mailsTo(to);
    expect(mails).toHaveLength(1);
    expect(mails[0]!.subject).toBe(`Hello ${to}`);
    const row = await MailOutbox.findOne({ where: { toAddress: to } });
    expect(row).toMatchObject({ state: 'sent', attempts: 1, lastError: null });
    expect(row!.sentAt).toBeInstanceOf(Date);
    expect(mails[0]!.messageId).toBe(`<outbox-${row!.id}@bayslate.test>`);
  });

  it('keeps the mail when SMTP is down and sends it on a later pass', async () => {
    const to = uniqueAddress('retry');
    await queue(to);
    const down = fakeTransport(await closedPort());
    const r = await processDueMail({ transport: down });
    expect(r.retry).toBeGreaterThanOrEqual(1);
    const row = (await MailOutbox.findOne({ where: { toAddress: to } }))!;
    expect(row.state).toBe('queued');
    expect(row.attempts).toBe(1);
    expect(row.lastError).toMatch(/ECONNREFUSED|connect/i);
    // Not due yet: the backoff pushed it into the future.
    expect(row.nextAttemptAt.getTime()).toBeGreaterThan(Date.now() + backoffMs(1) - 5000);
    expect((await processDueMail()).sent).toBe(0);
    expect(await mailsTo(to)).toHaveLength(0);
    // Time passes (the retry is due): the working SMTP gets it, once.
    await sequelize.query('UPDATE mail_outbox SET next_attempt_at = now() WHERE id = :id', {
      replacements: { id: row.id },
    });
    expect((await processDueMail()).sent).toBe(1);
    expect(await mailsTo(to)).toHaveLength(1);
    await row.reload();
    expect(row).toMatchObject({ state: 'sent', attempts: 2, lastError: null });
  });

  it('backs off exponentially and gives up after the last attempt', async () => {
    const base = config().MAIL_RETRY_BASE_MS;
    expect([1, 2, 3, 4].map((n) => backoffMs(n))).toEqual([base, base * 2, base * 4, base * 8]);
    expect(backoffMs(40)).toBe(6 * 3_600_000);
    const to = uniqueAddress('giveup');
    await queue(to);
    await sequelize.query('UPDATE mail_outbox SET attempts = :n WHERE to_address = :to', {
      replacements: { n: config().MAIL_MAX_ATTEMPTS - 1, to },
    });
    await processDueMail({ transport: fakeTransport(await closedPort()) });
    const row = (await MailOutbox.findOne({ where: { toAddress: to } }))!;
    expect(row.state).toBe('failed');
    expect(row.attempts).toBe(config().MAIL_MAX_ATTEMPTS);
  });

  it('two workers at once never send the same mail twice', async () => {
    const addresses = Array.from({ length: 12 }, (_, i) => uniqueAddress(`pair${i}`));
    for (const a of addresses) await queue(a);
    const real = mailTransport()!;
    const seen: string[] = [];
    const counting = (label: string) =>
      ({
        sendMail: async (m: { messageId: string }) => {
          seen.push(`${label}:${m.messageId}`);
          // Slow enough that both workers are busy at the same time.
          await new Promise((r) => setTimeout(r, 20));
          return real.sendMail(m as never);
        },
      }) as unknown as Transporter;
    const [a, b] = await Promise.all([
      processDueMail({ transport: counting('a') }),
      processDueMail({ transport: counting('b') }),
    ]);
    expect(a.sent + b.sent).toBeGreaterThanOrEqual(12);
    const ids = seen.map((s) => s.split(':')[1]);
    expect(new Set(ids).size).toBe(ids.length);
    expect(seen.some((s) => s.startsWith('a:'))).toBe(true);
    expect(seen.some((s) => s.startsWith('b:'))).toBe(true);
    for (const addr of addresses) expect(await mailsTo(addr)).toHaveLength(1);
  });

  it('queues one mail per dedupe key', async () => {
    const to = uniqueAddress('dedupe');
    expect(await queue(to, { dedupeKey: `k:${to}` })).toBe(true);
    expect(await queue(to, { dedupeKey: `k:${to}` })).toBe(false);
    expect(await MailOutbox.count({ where: { toAddress: to } })).toBe(1);
  });

  it('blanks address and body of a scrubbed mail once sent', async () => {
    const to = uniqueAddress('scrub');
    await queue(to, { scrubAfterSend: true, text: 'secret link https://example.test/confirm/abc' });
    const before = await count('mail_outbox');
    await processDueMail();
    expect(await count('mail_outbox')).toBe(before);
    expect(await MailOutbox.count({ where: { toAddress: to } })).toBe(0);
    expect((await mailsTo(to))[0]!.text).toContain('confirm/abc');
    const [rows] = await sequelize.query(
      `SELECT count(*)::int AS n FROM mail_outbox WHERE text_body LIKE '%confirm/abc%'`,
    );
    expect((rows as { n: number }[])[0]!.n).toBe(0);
  });
});

describe('mail health, invitation and the development inbox', () => {
  it('GET /api/health reports mail', async () => {
    const res = await anonymous().get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body.mail).toBe(true);
  });

  it('a new person gets an invitation mail with the sign-in page and without the password', async () => {
    const owner = await signInAs('owner');
    const email = uniqueAddress('newhire');
    const res = await owner.post('/api/users').send({ email, name: 'Kit Aldana', roles: ['installer'] });
    expect(res.status).toBe(201);
    expect(await MailOutbox.count({ where: { toAddress: email, kind: 'invitation' } })).toBe(1);
    await processDueMail();
    const [mail] = await mailsTo(email);
    expect(mail!.subject).toBe('You have a Bayslate account');
    expect(mail!.text).toContain(`${config().publicUrl}/sign-in`);
    expect(mail!.text).not.toContain(res.body.temporaryPassword);
  });

  it('the invitation link sets a password once, and the person signs in with it', async () => {
    const owner = await signInAs('owner');
    const email = uniqueAddress('invitee');
    expect((await owner.post('/api/users').send({ email, name: 'Noor Hale', roles: ['marketing'] })).status).toBe(201);
    await processDueMail();
    const [mail] = await mailsTo(email);
    const token = linkIn(mail!, '/welcome/').split('/welcome/')[1]!;
    expect(await count('invitation_links')).toBeGreaterThan(0);
    const [stored] = await sequelize.query(`SELECT count(*)::int AS n FROM invitation_links WHERE token_hash = :t`, {
      replacements: { t: token },
    });
    expect((stored as { n: number }[])[0]!.n).toBe(0); // only the hash is kept
    const who = await anonymous().get(`/api/invitations/${token}`);
    expect(who.status).toBe(200);
    expect(who.body).toEqual({ name: 'Noor Hale', email });
    const short = await anonymous().post(`/api/invitations/${token}`).send({ password: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.fields[0].path).toBe('password');
    expect(
      (await anonymous().post(`/api/invitations/${token}`).send({ password: 'a-good-long-password' })).status,
    ).toBe(200);
    expect((await anonymous().post('/api/auth/login').send({ email, password: 'a-good-long-password' })).status).toBe(
      200,
    );
    const again = await anonymous().post(`/api/invitations/${token}`).send({ password: 'another-long-password' });
    expect(again.status).toBe(410);
    expect(again.body.error.code).toBe('link_used');
    expect((await anonymous().post('/api/auth/login').send({ email, password: 'another-long-password' })).status).toBe(
      401,
    );
  });

  it('an expired or unknown invitation link is refused', async () => {
    const owner = await signInAs('owner');
    const email = uniqueAddress('late-invitee');
    await owner.post('/api/users').send({ email, name: 'Late Invitee', roles: ['installer'] });
    await processDueMail();
    const token = linkIn((await mailsTo(email))[0]!, '/welcome/').split('/welcome/')[1]!;
    await sequelize.query(`UPDATE invitation_links SET expires_at = now() - interval '1 minute'`);
    const res = await anonymous().post(`/api/invitations/${token}`).send({ password: 'a-good-long-password' });
    expect(res.status).toBe(410);
    expect(res.body.error.code).toBe('link_expired');
    expect((await anonymous().get('/api/invitations/abcdefghijklmnopqrstuvwxyz0123456789')).status).toBe(404);
  });

  it('a refused new person (duplicate e-mail) queues no mail', async () => {
    const owner = await signInAs('owner');
    const before = await count('mail_outbox');
    const res = await owner
      .post('/api/users')
      .send({ email: 'installer@cedar-ridge.test', name: 'Twice', roles: ['installer'] });
    expect(res.status).toBe(409);
    expect(await count('mail_outbox')).toBe(before);
  });

  it('/dev/mail lists mail newest first and shows a message escaped, with links', async () => {
    const to = uniqueAddress('inbox');
    await queue(to, {
      subject: '<script>alert(1)</script> hi',
      text: 'Open <b>this</b>: https://example.test/confirm/xyz now',
    });
    await processDueMail();
    const list = await anonymous().get('/dev/mail');
    expect(list.status).toBe(200);
    expect(list.text).toContain('&lt;script&gt;alert(1)&lt;/script&gt; hi');
    expect(list.text).not.toContain('<script>alert');
    const file = (await mailsTo(to))[0]!.file;
    const idx = list.text.indexOf(file);
    expect(idx).toBeGreaterThan(0);
    const one = await anonymous().get(`/dev/mail/${file}`);
    expect(one.status).toBe(200);
    expect(one.text).toContain('Open &lt;b&gt;this&lt;/b&gt;');
    expect(one.text).toContain('<a href="https://example.test/confirm/xyz">https://example.test/confirm/xyz</a>');
    expect((await anonymous().get('/dev/mail/..%2F..%2Fetc%2Fpasswd')).status).toBe(404);
  });

  it('/dev/mail answers 404 outside demo mode', async () => {
    const c = config();
    c.BAYSLATE_DEMO = false;
    try {
      expect((await anonymous().get('/dev/mail')).status).toBe(404);
    } finally {
      c.BAYSLATE_DEMO = true;
    }
  });
});
