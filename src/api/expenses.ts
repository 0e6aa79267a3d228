// Other costs of one build (consumables, shipping, filming), optionally on an upgrade; money roles only.
import { api, qs } from './http';
import type { Expense as ExpenseRecord, ExpenseAnswer, ExpenseList } from '@shared/contracts/expense';

export type ExpenseInput = Partial<Omit<ExpenseRecord, 'id' | 'buildId'>>;

const base = (buildId: number) => `/api/builds/${buildId}/expenses`;

export const expensesApi = {
  list: (buildId: number, q: { upgradeId?: number } = {}) => api.get<ExpenseList>(base(buildId) + qs({ ...q })),
  create: (buildId: number, body: ExpenseInput) => api.post<ExpenseAnswer>(base(buildId), body),
  update: (buildId: number, id: number, body: ExpenseInput) => api.patch<ExpenseAnswer>(`${base(buildId)}/${id}`, body),
  remove: (buildId: number, id: number) => api.del<void>(`${base(buildId)}/${id}`),
};
