// Mail wiring: the 'mail' health check. The local fake SMTP runs in a process of its own
// (scripts/start.mjs sets SMTP_URL to it), never inside the server.
import { registerHealthCheck } from '../health';
import { mailTransport } from './transport';

export { enqueueMail, type OutgoingMail } from './outbox';
export { processDueMail, startMailWorker, stopMailWorker } from './worker';

let installed = false;

export function installMail() {
  if (installed) return;
  installed = true;
  registerHealthCheck('mail', async () => {
    const t = mailTransport();
    return !!t && (await t.verify());
  });
}
