// Matrix rows for episodes, the plan, the shop floor and the calendar (routes/episodes.ts, plan.ts, shopFloor.ts, calendar.ts).
import type { MatrixContext, MatrixRow } from './types';
import { Build, Episode } from '../../../server/models';

const blankEpisode = {
  summary: null,
  shootDate: null,
  releaseDate: null,
  videoUrl: null,
  runtimeSeconds: null,
  publishedAt: null,
};

export async function prepare(ctx: MatrixContext) {
  const tern = await Build.findByPk(Number(ctx.ids.buildId));
  const first = await Episode.findOne({ where: { buildId: tern!.id }, order: [['number', 'ASC']] });
  ctx.ids.episodeId = first!.id;
  // A draft of its own for the DELETE row, so deleting it disturbs no other row.
  const count = await Episode.count({ where: { buildId: tern!.id } });
  ctx.ids.spareEpisodeId = (
    await Episode.create({ buildId: tern!.id, number: count + 50, title: 'Matrix spare', ...blankEpisode })
  ).id;
  ctx.ids.calendarToken = tern!.calendarToken;
  // A number far from 1 so another feature's prepare can add its own episode 1 to that build.
  ctx.other.ownEpisodeId = (
    await Episode.create({
      buildId: Number(ctx.other.buildId),
      number: 90,
      title: 'Other build episode',
      ...blankEpisode,
    })
  ).id;
}

const unknownBuild = (path: string) => (ctx: MatrixContext) =>
  path.replace(':buildId', String(Number(ctx.other.buildId) + 100000));
const otherEpisode =
  (suffix = '') =>
  (ctx: MatrixContext) =>
    `/api/builds/${ctx.ids.buildId}/episodes/${ctx.other.ownEpisodeId}${suffix}`;

export const rows: MatrixRow[] = [
  {
    method: 'GET',
    path: '/api/builds/:buildId/episodes',
    allow: ['producer', 'installer', 'marketing'],
    idor: unknownBuild('/api/builds/:buildId/episodes'),
  },
  {
    method: 'POST',
    path: '/api/builds/:buildId/episodes',
    allow: ['producer'],
    body: () => ({ title: '' }),
    idor: unknownBuild('/api/builds/:buildId/episodes'),
  },
  {
    method: 'PATCH',
    path: '/api/builds/:buildId/episodes/:episodeId',
    allow: ['producer', 'installer'],
    body: () => ({ title: '' }),
    idor: otherEpisode(),
  },
  {
    method: 'DELETE',
    path: '/api/builds/:buildId/episodes/:episodeId',
    allow: ['producer'],
    url: (ctx) => `/api/builds/${ctx.ids.buildId}/episodes/${ctx.ids.spareEpisodeId}`,
    idor: otherEpisode(),
  },
  {
    method: 'GET',
    path: '/api/builds/:buildId/plan',
    allow: ['producer'],
    idor: unknownBuild('/api/builds/:buildId/plan'),
  },
  {
    method: 'GET',
    path: '/api/builds/:buildId/plan/check',
    allow: ['producer'],
    idor: unknownBuild('/api/builds/:buildId/plan/check'),
  },
  {
    method: 'POST',
    path: '/api/builds/:buildId/plan/proposal',
    allow: ['producer'],
    body: () => ({ shootHoursPerEpisode: -1 }),
    idor: unknownBuild('/api/builds/:buildId/plan/proposal'),
  },
  {
    method: 'PUT',
    path: '/api/builds/:buildId/plan',
    allow: ['producer'],
    body: () => ({ episodes: [{ upgradeIds: ['x'] }] }),
    idor: unknownBuild('/api/builds/:buildId/plan'),
  },
  {
    method: 'GET',
    path: '/api/builds/:buildId/shop-floor',
    allow: ['producer', 'installer'],
    idor: (ctx) => `/api/builds/${ctx.ids.buildId}/shop-floor?episodeId=${ctx.other.ownEpisodeId}`,
  },
  {
    method: 'GET',
    path: '/api/builds/:buildId/calendar',
    allow: ['producer'],
    idor: unknownBuild('/api/builds/:buildId/calendar'),
  },
  {
    method: 'POST',
    path: '/api/builds/:buildId/calendar/rotate',
    allow: ['producer'],
    idor: unknownBuild('/api/builds/:buildId/calendar/rotate'),
  },
  {
    method: 'GET',
    path: '/api/calendar/:token.ics',
    allow: 'public',
    url: (ctx) => `/api/calendar/${ctx.ids.calendarToken}.ics`,
  },
];
