// Other costs of the build: owner and producer only (money through and through).
import { Router, type Request } from 'express';
import { z } from 'zod';
import { requireRole } from '../middleware/roles';
import { validate, validQuery } from '../middleware/validate';
import { buildOf, loadBuild } from '../middleware/build';
import { inBuild } from './upgrades';
import { Expense } from '../models';
import { upgradeFilterQuery } from '../../shared/schemas/removedPart';
import { createExpenseSchema, updateExpenseSchema } from '../../shared/schemas/expense';
import { forViewer } from '../services/visibility';
import * as service from '../services/expenses';

const recordInBuild = inBuild(Expense, 'expenseId', 'Expense');
const recordId = (req: Request) => Number(req.params.expenseId);

export function expensesRouter() {
  const router = Router({ mergeParams: true });
  router.use(loadBuild);

  router.get('/', requireRole('producer'), validate(upgradeFilterQuery, 'query'), async (req, res) => {
    const list = await service.listExpenses(buildOf(req), validQuery(req));
    res.json({ expenses: list.map((r) => forViewer(r, req.user)) });
  });
  router.post('/', requireRole('producer'), validate(createExpenseSchema), async (req, res) => {
    res.status(201).json({ expense: forViewer(await service.createExpense(req.user!, buildOf(req), req.body), req.user) });
  });
  router.patch('/:expenseId', requireRole('producer'), recordInBuild, validate(updateExpenseSchema), async (req, res) => {
    res.json({ expense: forViewer(await service.updateExpense(req.user!, buildOf(req), recordId(req), req.body), req.user) });
  });
  router.delete('/:expenseId', requireRole('producer'), recordInBuild, async (req, res) => {
    await service.deleteExpense(req.user!, buildOf(req), recordId(req));
    res.status(204).end();
  });
  return router;
}
