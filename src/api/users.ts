// Users and roles (owner only).
import { api } from './http';
import type { Role } from '@shared/domain';
import type { OkAnswer } from '@shared/contracts/common';
import type { User, UserAnswer, UserCreated, UserList } from '@shared/contracts/auth';

/** A person as the API sends them (shared/contracts/auth.ts). */
export type UserRow = User;

export const usersApi = {
  list: () => api.get<UserList>('/api/users'),
  create: (body: { email: string; name: string; roles: Role[]; password?: string }) =>
    api.post<UserCreated>('/api/users', body),
  update: (id: number, body: Partial<Pick<UserRow, 'name' | 'roles' | 'active'>>) =>
    api.patch<UserAnswer>(`/api/users/${id}`, body),
  resetPassword: (id: number, password: string) => api.post<OkAnswer>(`/api/users/${id}/password`, { password }),
};
