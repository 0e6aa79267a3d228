// Matrix rows for slips, baselines and notices (routes/slips.ts): producer and owner only.
import type { MatrixRow } from './types';

export const rows: MatrixRow[] = [
  {
    method: 'GET',
    path: '/api/builds/:buildId/slips',
    allow: ['producer'],
    idor: (ctx) => `/api/builds/${Number(ctx.other.buildId) + 100000}/slips`,
  },
  {
    method: 'GET',
    path: '/api/builds/:buildId/notices',
    allow: ['producer'],
    idor: (ctx) => `/api/builds/${Number(ctx.other.buildId) + 100000}/notices`,
  },
  {
    method: 'POST',
    path: '/api/builds/:buildId/notices/seen',
    allow: ['producer'],
    idor: (ctx) => `/api/builds/${Number(ctx.other.buildId) + 100000}/notices/seen`,
  },
];
