// Mail wiring: the local fake SMTP (when SMTP_URL is unset) and the 'mail' health check.
import path from 'node:path';
import { config } from '../config';
import { registerLocalService } from '../localServices';
// eslint-disable-next-line import-x/no-restricted-paths -- issue 13: the health-check registry belongs outside routes/ (routes/health.ts owner to move it)
import { registerHealthCheck } from '../routes/health';
import { startFakeSmtp, type FakeSmtp } from './fakeSmtp';
import { mailTransport, useLocalSmtp } from './transport';

export { enqueueMail, type OutgoingMail } from './outbox';
export { processDueMail, startMailWorker, stopMailWorker } from './worker';

let installed = false;

export function installMail() {
  if (installed) return;
  installed = true;
  if (!config().SMTP_URL) {
    let fake: FakeSmtp | null = null;
    registerLocalService({
      name: 'smtp',
      start: async () => {
        fake = await startFakeSmtp({ dir: path.resolve(config().LOCAL_MAIL_DIR), port: config().LOCAL_SMTP_PORT });
        useLocalSmtp(fake.port);
        console.log(`[bayslate] local mail: fake SMTP on 127.0.0.1:${fake.port}, messages in ${fake.dir}${config().BAYSLATE_DEMO ? ' (inbox at /dev/mail)' : ''}`);
      },
      stop: async () => {
        await fake?.stop();
        useLocalSmtp(null);
      },
    });
  }
  registerHealthCheck('mail', async () => {
    const t = mailTransport();
    return !!t && (await t.verify());
  });
}
