// What the server checks before it listens (deploy): a production start refuses demo mode and
// demo accounts, and every start needs real (or locally faked) object storage and mail.
import { QueryTypes } from 'sequelize';
import type { Config } from './config';
import { sequelize } from './db/sequelize';
import { DEMO_EMAILS } from './db/demoAccounts';

export class StartupRefused extends Error {}

/** Settings alone: no database needed. */
export function checkSettings(c: Config) {
  if (c.isProduction && c.BAYSLATE_DEMO) {
    throw new StartupRefused(
      'BAYSLATE_DEMO is on, and a production start (NODE_ENV=production) never runs with demo data and demo sign-ins. ' +
        'Unset BAYSLATE_DEMO (or set BAYSLATE_DEMO=0); for a local try-out with demo data use `npm start`.',
    );
  }
  if (!c.S3_ENDPOINT) {
    throw new StartupRefused(
      'S3_ENDPOINT is not set: name the object storage (see README, "Running it for real"). `npm start` runs a local fake S3 and sets it for you.',
    );
  }
  if (!c.SMTP_URL) {
    throw new StartupRefused(
      'SMTP_URL is not set: name the mail server (see README, "Running it for real"). `npm start` runs a local fake SMTP server and sets it for you.',
    );
  }
}

const activeDemoAccounts = () =>
  sequelize.query<{ email: string }>('SELECT email FROM users WHERE active AND email IN (:emails) ORDER BY email', {
    replacements: { emails: [...DEMO_EMAILS] },
    type: QueryTypes.SELECT,
  });

export const demoAccountsExist = async () => (await activeDemoAccounts()).length > 0;

/** After migrating: a production database must hold no active demo account. */
export async function checkNoDemoAccounts(c: Config) {
  if (!c.isProduction) return;
  const rows = await activeDemoAccounts();
  if (rows.length) {
    throw new StartupRefused(
      `this database has demo accounts (${rows.map((r) => r.email).join(', ')}), and a production start refuses to serve them. ` +
        `Point DATABASE_URL at a fresh database, or deactivate them: UPDATE users SET active = false WHERE email LIKE '%@cedar-ridge.test';`,
    );
  }
}
