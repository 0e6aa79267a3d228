// The public build page's data: only what a viewer may see. No money, no people, no internal
// notes: every field is picked here by name, never copied from a record.
import { QueryTypes } from 'sequelize';
import { sequelize, Build, Upgrade, Episode } from '../models';
import { notFound } from '../errors';
import { cachedPublic, keepPublic, publicStamp, type PublicEntry } from './publicBuildCache';
import { cautionsFor } from '../../shared/safety';
import { dayOf } from '../../shared/dates';
import { AREAS, AREA_LABELS, isUpgradeDone, type Area } from '../../shared/domain';
import { allow } from '../../shared/contracts/common';
import { PublicBuild } from '../../shared/contracts/public';

export type PublicStatus = 'planned' | 'in_progress' | 'coming_soon' | 'done';

/** A build by slug, only when it is marked public; otherwise the same 404 as an unknown slug. */
export async function publicBuildBySlug(slug: string) {
  const build = await Build.findOne({ where: { slug, isPublic: true } });
  if (!build) throw notFound('Build');
  return build;
}

/** Done only once an episode showing it is live; installed before that is "coming soon". */
function statusOf(u: Upgrade, liveIds: ReadonlyMap<number, number>): PublicStatus {
  if (isUpgradeDone(u) && u.episodeId && liveIds.has(u.episodeId)) return 'done';
  if (u.installState === 'installed') return 'coming_soon';
  return u.installState === 'queued' ? 'planned' : 'in_progress';
}

/** The page's answer for `slug`, from the cache when its build has not changed since. */
export async function publicBuildAnswer(slug: string): Promise<{ entry: PublicEntry; hit: boolean }> {
  const hit = cachedPublic(slug);
  if (hit) return { entry: hit, hit: true };
  const stamp = publicStamp();
  const { buildId, view } = await publicBuildViewOf(slug);
  // Only what the public contract names is kept and sent (shared/contracts/public.ts).
  return { entry: keepPublic(slug, buildId, stamp, allow(PublicBuild, view)), hit: false };
}

export async function publicBuildView(slug: string) {
  return (await publicBuildViewOf(slug)).view;
}

async function publicBuildViewOf(slug: string) {
  const build = await publicBuildBySlug(slug);
  const [upgrades, episodes, requests] = await Promise.all([
    Upgrade.findAll({
      where: { buildId: build.id },
      order: [
        ['episodePosition', 'ASC'],
        ['title', 'ASC'],
      ],
    }),
    Episode.findAll({ where: { buildId: build.id, state: 'live' }, order: [['number', 'ASC']] }),
    sequelize.query<{
      id: number;
      title: string;
      details: string | null;
      state: string;
      upgrade_id: number | null;
      votes: number;
    }>(
      `SELECT r.id, r.title, r.details, r.state, r.upgrade_id,
              count(v.id) FILTER (WHERE v.confirmed_at IS NOT NULL)::int AS votes
       FROM viewer_requests r LEFT JOIN viewer_votes v ON v.request_id = r.id
       WHERE r.build_id = :buildId AND r.state IN ('new','accepted') AND r.confirmed_at IS NOT NULL
       GROUP BY r.id ORDER BY votes DESC, r.created_at ASC LIMIT 200`,
      { replacements: { buildId: build.id }, type: QueryTypes.SELECT },
    ),
  ]);
  const liveIds = new Map(episodes.map((e) => [e.id, e.number]));
  const titleOf = new Map(upgrades.map((u) => [u.id, u.title]));

  const areas = AREAS.map((area: Area) => ({
    area,
    label: AREA_LABELS[area],
    upgrades: upgrades
      .filter((u) => u.area === area)
      .map((u) => ({
        id: u.id,
        title: u.title,
        // No spoilers: what it becomes shows once its episode is out.
        becomes: statusOf(u, liveIds) === 'coming_soon' ? null : u.becomes,
        status: statusOf(u, liveIds),
        safetyFlags: [...u.safetyFlags],
        liveEpisodeNumber: u.episodeId && liveIds.has(u.episodeId) ? liveIds.get(u.episodeId)! : null,
      })),
  })).filter((a) => a.upgrades.length > 0);

  const counts = { planned: 0, in_progress: 0, coming_soon: 0, done: 0 } as Record<PublicStatus, number>;
  for (const u of upgrades) counts[statusOf(u, liveIds)] += 1;

  const cautions = cautionsFor(upgrades.flatMap((u) => u.safetyFlags)).map((c) => ({
    flag: c.flag,
    label: c.label,
    caution: c.caution,
    upgrades: upgrades.filter((u) => u.safetyFlags.includes(c.flag)).map((u) => u.title),
  }));

  const view = {
    build: {
      slug: build.slug,
      title: build.name,
      vehicle: { year: build.year, make: build.make, model: build.model, trim: build.trim },
      summary: build.summary,
    },
    counts: {
      planned: counts.planned,
      inProgress: counts.in_progress,
      comingSoon: counts.coming_soon,
      done: counts.done,
    },
    areas,
    episodes: episodes.map((e) => ({
      number: e.number,
      title: e.title,
      summary: e.summary,
      videoUrl: e.videoUrl,
      // The day it went out where the shop is (the build's zone), as everywhere else.
      publishedOn: e.publishedAt ? dayOf(e.publishedAt, build.timeZone) : null,
      upgrades: upgrades.filter((u) => u.episodeId === e.id).map((u) => u.title),
    })),
    cautions,
    requests: requests.map((r) => ({
      id: r.id,
      title: r.title,
      details: r.details,
      state: r.state as 'new' | 'accepted',
      votes: r.votes,
      upgrade: r.upgrade_id ? (titleOf.get(r.upgrade_id) ?? null) : null,
    })),
  };
  return { buildId: build.id, view };
}
