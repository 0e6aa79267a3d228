// Outgoing mail that could not be sent (owner only): the list and sending one again.
import { api } from './http';
import type { OkAnswer } from '@shared/contracts/common';
import type { FailedMailList } from '@shared/contracts/mail';

export type { FailedMail } from '@shared/contracts/mail';

export const mailApi = {
  failed: () => api.get<FailedMailList>('/api/mail/failed'),
  resend: (id: number) => api.post<OkAnswer>(`/api/mail/${id}/resend`, {}),
};
