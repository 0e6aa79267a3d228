// Matrix rows for issue 11's routes: an episode's readiness to go live, and the plan's revisions
// and undo (routes/publishing.ts, plan.ts).
import type { MatrixContext, MatrixRow } from './types';
import { Build, Episode } from '../../../server/models';

export async function prepare(ctx: MatrixContext) {
  const tern = await Build.findOne({ where: { slug: 'project-tern' } });
  ctx.ids.episodeId ??= (await Episode.findOne({ where: { buildId: tern!.id }, order: [['number', 'ASC']] }))!.id;
  ctx.other.readinessEpisodeId = (
    await Episode.create({ buildId: Number(ctx.other.buildId), number: 90, title: 'Other readiness episode', summary: null, shootDate: null, releaseDate: null, videoUrl: null, runtimeSeconds: null, publishedAt: null })
  ).id;
}

export const rows: MatrixRow[] = [
  {
    method: 'GET',
    path: '/api/builds/:buildId/episodes/:episodeId/readiness',
    allow: ['marketing', 'producer'],
    idor: (c) => `/api/builds/${c.ids.buildId}/episodes/${c.other.readinessEpisodeId}/readiness`,
  },
];
