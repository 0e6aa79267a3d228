// Sign-in and session calls.
import { api } from './http';
import type { SessionUser } from '@shared/schemas/auth';

export const authApi = {
  login: (email: string, password: string) => api.post<{ user: SessionUser }>('/api/auth/login', { email, password }),
  logout: () => api.post<{ ok: true }>('/api/auth/logout'),
  me: () => api.get<{ user: SessionUser }>('/api/auth/me'),
  changePassword: (currentPassword: string, newPassword: string) => api.post('/api/auth/password', { currentPassword, newPassword }),
  demoInfo: () => api.get<{ demo: boolean; accounts: string[]; password: string | null }>('/api/health/demo'),
};
