// Matrix rows for the failed-mail panel (routes/mail.ts): the owner only.
import type { MatrixRow } from './types';

export const rows: MatrixRow[] = [
  { method: 'GET', path: '/api/mail/failed', allow: ['owner'] },
  // An id no mail has: the owner gets 404, nothing is queued again.
  { method: 'POST', path: '/api/mail/:mailId/resend', allow: ['owner'], url: () => '/api/mail/987654321/resend' },
];
