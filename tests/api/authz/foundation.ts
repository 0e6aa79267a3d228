// Matrix rows for health, sign-in and users (routes/health.ts, auth.ts, users.ts).
import type { MatrixContext, MatrixRow } from './types';
import { User } from '../../../server/models';

export async function prepare(ctx: MatrixContext) {
  const u = await User.findOne({ where: { email: 'installer@cedar-ridge.test' } });
  ctx.ids.userId = u!.id;
}

export const rows: MatrixRow[] = [
  { method: 'GET', path: '/api/health', allow: 'public' },
  { method: 'GET', path: '/api/health/demo', allow: 'public' },
  { method: 'POST', path: '/api/auth/login', allow: 'public', body: () => ({}) },
  { method: 'POST', path: '/api/auth/logout', allow: 'public', endsSession: true },
  { method: 'GET', path: '/api/auth/me', allow: 'signed-in' },
  { method: 'POST', path: '/api/auth/password', allow: 'signed-in', body: () => ({}) },
  { method: 'GET', path: '/api/users', allow: ['owner'] },
  { method: 'POST', path: '/api/users', allow: ['owner'], body: () => ({}) },
  { method: 'PATCH', path: '/api/users/:userId', allow: ['owner'], body: () => ({}) },
  { method: 'POST', path: '/api/users/:userId/password', allow: ['owner'], body: () => ({}) },
];
