// Other costs of the build: owner and producer only (money through and through).
import type { Request } from 'express';
import { buildOf } from '../middleware/build';
import { validQuery } from '../middleware/validate';
import { buildScopedRouter, recordInBuild } from './buildScoped';
import { Expense } from '../models';
import { upgradeFilterQuery } from '../../shared/schemas/removedPart';
import { createExpenseSchema, updateExpenseSchema } from '../../shared/schemas/expense';
import { ExpenseAnswer, ExpenseList } from '../../shared/contracts/expense';
import { send } from './send';
import * as service from '../services/expenses';

const expenseInBuild = recordInBuild(Expense, 'expenseId', 'Expense');
const recordId = (req: Request) => Number(req.params.expenseId);

export function expensesRouter() {
  return buildScopedRouter()
    .get('/', { roles: ['producer'], query: upgradeFilterQuery }, async (req, res) => {
      const list = await service.listExpenses(buildOf(req), validQuery(req));
      send(res, ExpenseList, { expenses: list });
    })
    .post('/', { roles: ['producer'], body: createExpenseSchema }, async (req, res) => {
      send(res, ExpenseAnswer, { expense: await service.createExpense(req.user!, buildOf(req), req.body) }, 201);
    })
    .patch(
      '/:expenseId',
      { roles: ['producer'], record: expenseInBuild, body: updateExpenseSchema },
      async (req, res) => {
        send(res, ExpenseAnswer, {
          expense: await service.updateExpense(req.user!, buildOf(req), recordId(req), req.body),
        });
      },
    )
    .delete('/:expenseId', { roles: ['producer'], record: expenseInBuild }, async (req, res) => {
      await service.deleteExpense(req.user!, buildOf(req), recordId(req));
      res.status(204).end();
    }).router;
}
