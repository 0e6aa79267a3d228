// Outgoing mail that could not be sent, for the owner: the list, and sending one again
// (mounted at /api/mail).
import { Router } from 'express';
import { z } from 'zod';
import { validate } from '../middleware/validate';
import { requireRole } from '../middleware/roles';
import { id } from '../../shared/schemas/common';
import { AppError } from '../errors';
import { listFailedMails, resendMail } from '../mail/outbox';
import { record } from '../services/activity';
import { sequelize } from '../models';
import { FailedMailList } from '../../shared/contracts/mail';
import { OkAnswer } from '../../shared/contracts/common';
import { send } from './send';

export function mailRouter() {
  const router = Router();
  router.use(requireRole('owner'));
  router.get('/failed', async (_req, res) => {
    send(res, FailedMailList, { mails: await listFailedMails() });
  });
  router.post('/:mailId/resend', validate(z.object({ mailId: id }), 'params'), async (req, res) => {
    const mailId = Number(req.params.mailId);
    await sequelize.transaction(async (t) => {
      if (!(await resendMail(mailId, t)))
        throw new AppError(404, 'not_found', 'No failed mail with this number (it may have been sent again already).');
      await record(t, {
        actor: req.user!,
        buildId: null,
        entity: 'mail',
        entityId: mailId,
        action: 'resend',
        summary: `Queued failed mail ${mailId} again`,
        changes: {},
      });
    });
    send(res, OkAnswer, { ok: true });
  });
  return router;
}
