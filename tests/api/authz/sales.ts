// Matrix rows for kit sales (routes/sales.ts): figures for owner, producer and marketing (cost-based
// fields for the owner only, checked in sales.test.ts); the mapping and the import for owner and marketing.
import type { MatrixRow } from './types';

const otherBuild = (ctx: { other: Record<string, number | string> }, rest: string) =>
  `/api/builds/${Number(ctx.other.buildId) + 100000}/sales${rest}`;

export const rows: MatrixRow[] = [
  {
    method: 'GET',
    path: '/api/builds/:buildId/sales',
    allow: ['marketing', 'producer'],
    idor: (ctx) => otherBuild(ctx, ''),
  },
  {
    method: 'GET',
    path: '/api/builds/:buildId/sales/lines',
    allow: ['marketing', 'producer'],
    idor: (ctx) => otherBuild(ctx, '/lines'),
  },
  {
    method: 'GET',
    path: '/api/builds/:buildId/sales/mapping',
    allow: ['marketing'],
    idor: (ctx) => otherBuild(ctx, '/mapping'),
  },
  // A JSON body is not a CSV file: allowed callers get 415 and nothing is written.
  {
    method: 'POST',
    path: '/api/builds/:buildId/sales/import',
    allow: ['marketing'],
    body: () => ({ not: 'csv' }),
    idor: (ctx) => otherBuild(ctx, '/import'),
  },
];
