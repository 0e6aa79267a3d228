// Matrix rows for media (routes/media.ts): installers, producers and owners upload and edit;
// every role reads; a media id of the demo build through another build's path answers 404.
import type { MatrixContext, MatrixRow } from './types';
import { Media } from '../../../server/models';

export async function prepare(ctx: MatrixContext) {
  // A demo photo (seeder 0004): not an invoice, so every role could see it in its own build.
  const m = await Media.findOne({ where: { buildId: ctx.ids.buildId, kind: 'photo' }, order: [['id', 'ASC']] });
  ctx.ids.mediaId = m?.id ?? 0;
}

const base = '/api/builds/:buildId/media';
const through = (ctx: MatrixContext, suffix = '') =>
  `/api/builds/${ctx.other.buildId}/media/${ctx.ids.mediaId}${suffix}`;
// DELETE must not remove the demo photo for the next role: allowed roles name a missing id (404).
const missing = (ctx: MatrixContext) => `/api/builds/${ctx.ids.buildId}/media/2147483000`;

export const rows: MatrixRow[] = [
  { method: 'GET', path: base, allow: ['producer', 'installer', 'marketing'] },
  // JSON instead of a multipart form: allowed roles get 400 and nothing is stored.
  { method: 'POST', path: base, allow: ['producer', 'installer'], body: () => ({ caption: 'not a form' }) },
  {
    method: 'PATCH',
    path: `${base}/:mediaId`,
    allow: ['producer', 'installer'],
    body: () => ({ stage: 'not-a-stage' }),
    idor: (ctx) => through(ctx),
  },
  {
    method: 'DELETE',
    path: `${base}/:mediaId`,
    allow: ['producer', 'installer'],
    url: missing,
    idor: (ctx) => through(ctx),
  },
  {
    method: 'GET',
    path: `${base}/:mediaId/download`,
    allow: ['producer', 'installer', 'marketing'],
    idor: (ctx) => through(ctx, '/download'),
  },
];
