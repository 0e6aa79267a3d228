// Other costs of a build: money through and through, read by money roles only (the routes refuse
// the others), so one contract.
import { z } from 'zod';
import { day, idNumber, type RouteTable } from './common';

export const Expense = z.object({
  id: idNumber,
  buildId: idNumber,
  upgradeId: idNumber.nullable(),
  description: z.string(),
  amountCents: z.number().int(),
  spentOn: day,
  category: z.string().nullable(),
});
export type Expense = z.infer<typeof Expense>;

export const ExpenseList = z.object({ expenses: z.array(Expense) });
export type ExpenseList = z.infer<typeof ExpenseList>;
export const ExpenseAnswer = z.object({ expense: Expense });
export type ExpenseAnswer = z.infer<typeof ExpenseAnswer>;

export const expenseRoutes = {
  'GET /api/builds/:buildId/expenses': ExpenseList,
  'POST /api/builds/:buildId/expenses': ExpenseAnswer,
  'PATCH /api/builds/:buildId/expenses/:expenseId': ExpenseAnswer,
} satisfies RouteTable;
