// Outgoing mail that could not be sent (owner only): the list and sending one again.
import { api } from './http';

export interface FailedMail {
  id: number;
  kind: string;
  to: string;
  subject: string;
  attempts: number;
  lastError: string | null;
  createdAt: string;
}

export const mailApi = {
  failed: () => api.get<{ mails: FailedMail[] }>('/api/mail/failed'),
  resend: (id: number) => api.post<{ ok: true }>(`/api/mail/${id}/resend`, {}),
};
