// The owner's panel of mail that could not be sent (issue 10): listed on Users & roles, sent again
// with one click, in both themes and at phone width.
import { describe, it, afterAll, beforeAll } from 'vitest';
import { QueryTypes } from 'sequelize';
import { openBrowser, signIn, signInQuick, audit, startAppServer, type AppServer } from '../helpers/browser';
import { sequelize } from '../../server/models';
import { enqueueMail } from '../../server/mail/outbox';

let server: AppServer;
beforeAll(async () => {
  server = await startAppServer({ MAIL_WORKER: '0' });
});
afterAll(async () => {
  await server?.stop();
  await sequelize.close();
});

async function failedMail(to: string, subject: string) {
  await enqueueMail(null, { kind: 'invitation', to, subject, text: 'Choose your password.' });
  const [row] = await sequelize.query<{ id: number }>(
    `UPDATE mail_outbox SET state = 'failed', attempts = 8, last_error = 'connect ECONNREFUSED 127.0.0.1:25' WHERE to_address = :to RETURNING id::int AS id`,
    { replacements: { to }, type: QueryTypes.SELECT },
  );
  return row!.id;
}

describe('failed mail panel', () => {
  it('the owner sees a failed mail with its error and sends it again (desktop, dark theme)', async () => {
    const id = await failedMail('new.hire@cedar-ridge.test', 'You have a Bayslate account');
    const s = await openBrowser({ server });
    try {
      await s.page.emulateMedia({ colorScheme: 'dark' });
      await signIn(s, 'owner');
      await s.page.getByRole('link', { name: 'Users & roles' }).click();
      const row = s.page.locator(`[data-mail-id="${id}"]`);
      await row.getByText('ECONNREFUSED').waitFor();
      await audit(s, 'users with a failed mail (dark)', { contrast: true });
      await row.getByRole('button', { name: 'Send again' }).click();
      await s.page.getByText('Mail to new.hire@cedar-ridge.test is queued again.').waitFor();
      await row.waitFor({ state: 'detached' });
      await s.page.getByText('No failed mail').waitFor();
      await audit(s, 'users without failed mail (dark)', { contrast: true });
    } finally {
      await s.close();
    }
  });

  it('fits a phone in the light theme', async () => {
    const id = await failedMail('phone.hire@cedar-ridge.test', 'You have a Bayslate account');
    const s = await openBrowser({ server, phone: true });
    try {
      await s.page.emulateMedia({ colorScheme: 'light' });
      await signInQuick(s, 'owner');
      await s.page.goto(`${server.url}/users`);
      const row = s.page.locator(`[data-mail-id="${id}"]`);
      await row.getByRole('button', { name: 'Send again' }).waitFor();
      await audit(s, 'users with a failed mail (phone)', { contrast: true });
      const overflow = await s.page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
      if (overflow > 1) throw new Error(`the page is ${overflow}px wider than the phone`);
    } finally {
      await s.close();
    }
  });
});
