// Matrix rows for the build overview (routes/overview.ts): owner and producer only.
import type { MatrixRow } from './types';

export const rows: MatrixRow[] = [
  {
    method: 'GET',
    path: '/api/builds/:buildId/overview',
    allow: ['producer'],
    // A build id that does not exist, through the same path, answers 404 and never a figure.
    idor: (ctx) => `/api/builds/${Number(ctx.other.buildId) + 100000}/overview`,
  },
];
