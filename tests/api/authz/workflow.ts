// Matrix rows for issue 11's routes: an episode's readiness to go live, and the plan's revisions
// and undo (routes/publishing.ts, plan.ts).
import type { MatrixContext, MatrixRow } from './types';
import { Build, Episode } from '../../../server/models';

export async function prepare(ctx: MatrixContext) {
  const tern = await Build.findOne({ where: { slug: 'project-tern' } });
  ctx.ids.episodeId ??= (await Episode.findOne({ where: { buildId: tern!.id }, order: [['number', 'ASC']] }))!.id;
  // An episode of the other build (the marketing rows make one; prepares run in file order).
  ctx.other.readinessEpisodeId ??=
    ctx.other.episodeId ?? (await Episode.findOne({ where: { buildId: Number(ctx.other.buildId) } }))!.id;
}

export const rows: MatrixRow[] = [
  {
    method: 'GET',
    path: '/api/builds/:buildId/episodes/:episodeId/readiness',
    allow: ['marketing', 'producer'],
    idor: (c) => `/api/builds/${c.ids.buildId}/episodes/${c.other.readinessEpisodeId}/readiness`,
  },
  {
    method: 'GET',
    path: '/api/builds/:buildId/plan/revisions',
    allow: ['producer'],
    idor: () => '/api/builds/999999/plan/revisions',
  },
  // A body without basedOn: allowed callers get 400 and nothing is undone.
  {
    method: 'POST',
    path: '/api/builds/:buildId/plan/undo',
    allow: ['producer'],
    body: () => ({}),
    idor: () => '/api/builds/999999/plan/undo',
  },
];
