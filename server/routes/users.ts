// Users and roles, for the owner only.
import { Router } from 'express';
import { z } from 'zod';
import { validate } from '../middleware/validate';
import { requireRole } from '../middleware/roles';
import { createUserSchema, updateUserSchema, resetPasswordSchema } from '../../shared/schemas/auth';
import { id } from '../../shared/schemas/common';
import * as users from '../services/users';
import { UserAnswer, UserCreated, UserList } from '../../shared/contracts/auth';
import { OkAnswer } from '../../shared/contracts/common';
import { send } from './send';

const params = z.object({ userId: id });

export function usersRouter() {
  const router = Router();
  router.use(requireRole('owner'));

  router.get('/', async (_req, res) => {
    send(res, UserList, { users: await users.listUsers() });
  });
  router.post('/', validate(createUserSchema), async (req, res) => {
    send(res, UserCreated, await users.createUser(req.user!, req.body), 201);
  });
  router.patch('/:userId', validate(params, 'params'), validate(updateUserSchema), async (req, res) => {
    send(res, UserAnswer, { user: await users.updateUser(req.user!, Number(req.params.userId), req.body) });
  });
  router.post('/:userId/password', validate(params, 'params'), validate(resetPasswordSchema), async (req, res) => {
    await users.setPassword(req.user!, Number(req.params.userId), req.body.password);
    send(res, OkAnswer, { ok: true });
  });
  return router;
}
