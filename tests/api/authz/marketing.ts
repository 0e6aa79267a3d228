// Matrix rows for product links, chapters, show notes, publishing, viewer requests and the
// public build API (routes/publishing.ts, linkHealth.ts, viewerRequests.ts, public.ts).
import type { MatrixContext, MatrixRow } from './types';
import { Build, Episode, ViewerRequest } from '../../../server/models';

export async function prepare(ctx: MatrixContext) {
  const tern = await Build.findOne({ where: { slug: 'project-tern' } });
  const ep = await Episode.findOne({ where: { buildId: tern!.id }, order: [['number', 'ASC']] });
  const req = await ViewerRequest.findOne({ where: { buildId: tern!.id } });
  ctx.ids.episodeId = ep!.id;
  ctx.ids.requestId = req!.id;
  ctx.ids.slug = 'project-tern';
  // Shaped like our links, but no such token: the public routes answer 404, never 401/403.
  ctx.ids.token = 'no-such-token-no-such-token-0123456789abcdef';
  const otherEp = await Episode.create({
    buildId: Number(ctx.other.buildId),
    number: 1,
    title: 'Other episode',
    summary: null,
    shootDate: null,
    releaseDate: null,
    videoUrl: null,
    runtimeSeconds: null,
    publishedAt: null,
  });
  const otherReq = await ViewerRequest.create({
    buildId: Number(ctx.other.buildId),
    title: 'Other request',
    details: null,
    confirmedAt: new Date(),
  });
  ctx.other.episodeId = otherEp.id;
  ctx.other.requestId = otherReq.id;
}

const PUBLISHERS: MatrixRow['allow'] = ['marketing', 'producer'];
const ep = (ctx: MatrixContext, suffix: string) =>
  `/api/builds/${ctx.ids.buildId}/episodes/${ctx.other.episodeId}/${suffix}`;

export const rows: MatrixRow[] = [
  {
    method: 'GET',
    path: '/api/builds/:buildId/episodes/:episodeId/chapters',
    allow: PUBLISHERS,
    idor: (c) => ep(c, 'chapters'),
  },
  {
    method: 'PUT',
    path: '/api/builds/:buildId/episodes/:episodeId/chapters',
    allow: PUBLISHERS,
    body: () => ({ chapters: 'none' }),
    idor: (c) => ep(c, 'chapters'),
  },
  {
    method: 'GET',
    path: '/api/builds/:buildId/episodes/:episodeId/show-notes',
    allow: PUBLISHERS,
    idor: (c) => ep(c, 'show-notes'),
  },
  {
    method: 'POST',
    path: '/api/builds/:buildId/episodes/:episodeId/publish',
    allow: PUBLISHERS,
    body: () => ({ videoUrl: 'javascript:alert(1)' }),
  },
  { method: 'GET', path: '/api/builds/:buildId/link-health', allow: PUBLISHERS },
  { method: 'GET', path: '/api/builds/:buildId/campaign', allow: PUBLISHERS },
  {
    method: 'PUT',
    path: '/api/builds/:buildId/campaign',
    allow: PUBLISHERS,
    body: () => ({ campaign: 'Not A Slug!' }),
  },
  { method: 'GET', path: '/api/builds/:buildId/viewer-requests', allow: PUBLISHERS },
  {
    method: 'PATCH',
    path: '/api/builds/:buildId/viewer-requests/:requestId',
    allow: PUBLISHERS,
    body: () => ({ action: 'decline' }),
    idor: (c) => `/api/builds/${c.ids.buildId}/viewer-requests/${c.other.requestId}`,
  },
  { method: 'GET', path: '/api/public/builds/:slug', allow: 'public' },
  { method: 'POST', path: '/api/public/builds/:slug/requests', allow: 'public', body: () => ({ title: 'x' }) },
  {
    method: 'POST',
    path: '/api/public/builds/:slug/requests/:requestId/votes',
    allow: 'public',
    body: () => ({ email: 'not-an-address' }),
  },
  { method: 'GET', path: '/api/public/confirm/:token', allow: 'public' },
  { method: 'GET', path: '/api/public/unsubscribe/:token', allow: 'public' },
  { method: 'GET', path: '/api/invitations/:token', allow: 'public' },
  { method: 'POST', path: '/api/invitations/:token', allow: 'public', body: () => ({ password: 'short' }) },
];
