// Users and roles (owner only).
import { api } from './http';
import type { Role } from '@shared/domain';

export interface UserRow {
  id: number;
  email: string;
  name: string;
  roles: Role[];
  active: boolean;
}

export const usersApi = {
  list: () => api.get<{ users: UserRow[] }>('/api/users'),
  create: (body: { email: string; name: string; roles: Role[]; password?: string }) =>
    api.post<{ user: UserRow; temporaryPassword: string | null }>('/api/users', body),
  update: (id: number, body: Partial<Pick<UserRow, 'name' | 'roles' | 'active'>>) => api.patch<{ user: UserRow }>(`/api/users/${id}`, body),
  resetPassword: (id: number, password: string) => api.post(`/api/users/${id}/password`, { password }),
};

/** An invitation link (/welcome/:token): who it is for, and the password the new person chooses. */
export const invitationsApi = {
  read: (token: string) => api.get<{ name: string; email: string }>(`/api/invitations/${encodeURIComponent(token)}`),
  accept: (token: string, password: string) => api.post(`/api/invitations/${encodeURIComponent(token)}`, { password }),
};
