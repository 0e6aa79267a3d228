// Sign-in and session calls.
import { api } from './http';
import type { InvitationWho, SessionAnswer } from '@shared/contracts/auth';
import type { OkAnswer } from '@shared/contracts/common';

export const authApi = {
  login: (email: string, password: string) => api.post<SessionAnswer>('/api/auth/login', { email, password }),
  logout: () => api.post<OkAnswer>('/api/auth/logout'),
  me: () => api.get<SessionAnswer>('/api/auth/me'),
  changePassword: (currentPassword: string, newPassword: string) =>
    api.post<OkAnswer>('/api/auth/password', { currentPassword, newPassword }),
  demoInfo: () => api.get<{ demo: boolean; accounts: string[]; password: string | null }>('/api/health/demo'),
};

/** The invitation link's page (no sign-in): who the link is for, and choosing the password once. */
export const invitationsApi = {
  read: (token: string) => api.get<InvitationWho>(`/api/invitations/${encodeURIComponent(token)}`),
  accept: (token: string, password: string) =>
    api.post<OkAnswer>(`/api/invitations/${encodeURIComponent(token)}`, { password }),
};
