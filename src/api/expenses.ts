// Other costs of one build (consumables, shipping, filming), optionally on an upgrade; money roles only.
import { api, qs } from './http';
import type { ExpenseRecord } from '@shared/domain';

export type ExpenseInput = Partial<Omit<ExpenseRecord, 'id' | 'buildId'>>;

const base = (buildId: number) => `/api/builds/${buildId}/expenses`;

export const expensesApi = {
  list: (buildId: number, q: { upgradeId?: number } = {}) => api.get<{ expenses: ExpenseRecord[] }>(base(buildId) + qs({ ...q })),
  create: (buildId: number, body: ExpenseInput) => api.post<{ expense: ExpenseRecord }>(base(buildId), body),
  update: (buildId: number, id: number, body: ExpenseInput) => api.patch<{ expense: ExpenseRecord }>(`${base(buildId)}/${id}`, body),
  remove: (buildId: number, id: number) => api.del<void>(`${base(buildId)}/${id}`),
};
