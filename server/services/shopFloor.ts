// The installer's view of the bay: first every upgrade in the bay now whatever its episode's state,
// then the episode being worked in running order; each with its parts, safety cautions (and whether
// this person has read them), hours logged, and whether its prerequisites are installed.
import { Op, QueryTypes } from 'sequelize';
import { sequelize, Activity, Episode, Part, Upgrade, UpgradePrerequisite, type Build } from '../models';
import { notFound } from '../errors';
import { toRecord, upgradeIdsByEpisode } from './episodes';
import { cautionsFor } from '../../shared/safety';
import { todayIn } from '../../shared/dates';
import { toPartRecord, toUpgradeRecord, type Person } from './backlogRecords';
import type { EpisodeRecord } from '../../shared/contracts/episode';

/** States an installer works in: about to be shot, or shot with pick-up work left. */
const WORKING_STATES = ['scheduled', 'shot', 'in_edit'] as const;

const round2 = (h: number) => Math.round(h * 100) / 100;

/**
 * The next episode to work: the scheduled one with the earliest shoot date (then lowest number);
 * failing that the earliest shot or in-edit one, which may still have a segment to film.
 */
async function pickEpisode(buildId: number, episodeId?: number) {
  if (episodeId) {
    const ep = await Episode.findOne({ where: { id: episodeId, buildId } });
    if (!ep) throw notFound('Episode');
    return ep;
  }
  const candidates = await Episode.findAll({
    where: { buildId, state: { [Op.in]: [...WORKING_STATES] } },
    order: [['number', 'ASC']],
  });
  const rank = (e: Episode) => WORKING_STATES.indexOf(e.state as (typeof WORKING_STATES)[number]);
  candidates.sort(
    (a, b) => rank(a) - rank(b) || (a.shootDate ?? '9999').localeCompare(b.shootDate ?? '9999') || a.number - b.number,
  );
  return candidates[0] ?? null;
}

/** Hours per upgrade (this person's and everyone's) and today's totals, from labour entries. */
async function hoursOf(buildId: number, ids: number[], userId: number, zone: string) {
  const rows = ids.length
    ? await sequelize.query<{ upgrade_id: number; mine: number; everyone: number }>(
        `SELECT upgrade_id, COALESCE(SUM(hours) FILTER (WHERE user_id = :u), 0)::float AS mine, SUM(hours)::float AS everyone
           FROM labour_entries WHERE build_id = :b AND upgrade_id IN (:ids) GROUP BY upgrade_id`,
        { replacements: { b: buildId, u: userId, ids }, type: QueryTypes.SELECT },
      )
    : [];
  // Today on the shop's own clock (the build's time zone).
  const day = todayIn(zone);
  const [t] = await sequelize.query<{ mine: number; everyone: number }>(
    `SELECT COALESCE(SUM(hours) FILTER (WHERE user_id = :u), 0)::float AS mine, COALESCE(SUM(hours), 0)::float AS everyone
       FROM labour_entries WHERE build_id = :b AND worked_on = :day`,
    { replacements: { b: buildId, u: userId, day }, type: QueryTypes.SELECT },
  );
  const byUpgrade = new Map(rows.map((r) => [r.upgrade_id, { mine: round2(r.mine), everyone: round2(r.everyone) }]));
  return { byUpgrade, today: { date: day, mine: round2(t.mine), everyone: round2(t.everyone) } };
}

async function items(build: Build, viewer: Person, ids: number[]) {
  const [ups, parts, edges, reads, hours] = await Promise.all([
    Upgrade.findAll({ where: { buildId: build.id, id: { [Op.in]: ids } } }),
    Part.findAll({ where: { buildId: build.id, upgradeId: { [Op.in]: ids } }, order: [['id', 'ASC']] }),
    UpgradePrerequisite.findAll({ where: { buildId: build.id, upgradeId: { [Op.in]: ids } } }),
    Activity.findAll({
      where: {
        buildId: build.id,
        entity: 'upgrade',
        entityId: { [Op.in]: ids },
        action: 'caution_read',
        userId: viewer.id,
      },
      attributes: ['entityId'],
    }),
    hoursOf(build.id, ids, viewer.id, build.timeZone),
  ]);
  const prereqIds = [...new Set(edges.map((e) => e.prerequisiteId))];
  const prereqs = prereqIds.length
    ? await Upgrade.findAll({
        where: { buildId: build.id, id: { [Op.in]: prereqIds } },
        attributes: ['id', 'title', 'installState'],
      })
    : [];
  const prereqById = new Map(prereqs.map((p) => [p.id, p]));
  const byId = new Map(ups.map((u) => [u.id, u]));
  const read = new Set(reads.map((r) => r.entityId));
  const list = ids.map((id) => {
    const u = byId.get(id)!;
    const mine = edges.filter((e) => e.upgradeId === id).map((e) => e.prerequisiteId);
    const blocked = mine.map((p) => prereqById.get(p)).filter((p) => p && p.installState !== 'installed');
    return {
      // Every field: the route's contract decides what leaves per role (ShopFloor in shared/contracts).
      upgrade: toUpgradeRecord(u, mine),
      parts: parts.filter((p) => p.upgradeId === id).map((p) => toPartRecord(p)),
      prerequisitesMet: blocked.length === 0,
      blockedBy: blocked.map((p) => p!.title),
      cautions: cautionsFor(u.safetyFlags),
      cautionRead: read.has(id),
      hours: hours.byUpgrade.get(id) ?? { mine: 0, everyone: 0 },
    };
  });
  return { list, today: hours.today };
}

export async function shopFloor(build: Build, viewer: Person, episodeId?: number) {
  const [ep, choices, idsByEpisode, inBayRows] = await Promise.all([
    pickEpisode(build.id, episodeId),
    Episode.findAll({
      where: { buildId: build.id, state: { [Op.in]: [...WORKING_STATES] } },
      order: [['number', 'ASC']],
    }),
    upgradeIdsByEpisode(build.id),
    Upgrade.findAll({
      where: { buildId: build.id, installState: 'in_bay' },
      attributes: ['id', 'episodeId'],
      order: [['id', 'ASC']],
    }),
  ]);
  const episodeOf = (e: Episode): EpisodeRecord => toRecord(e, idsByEpisode.get(e.id) ?? []);
  const choiceList = choices.map((e) => ({
    id: e.id,
    number: e.number,
    title: e.title,
    state: e.state,
    shootDate: e.shootDate,
  }));
  const ids = ep ? (idsByEpisode.get(ep.id) ?? []) : [];
  // In the bay now: in-bay work not already listed in the episode shown, so nothing shows twice.
  const inBayIds = inBayRows.filter((u) => !ids.includes(u.id)).map((u) => u.id);
  const { list, today: day } = await items(build, viewer, [...inBayIds, ...ids]);
  const episodeIds = [...new Set(inBayRows.map((u) => u.episodeId).filter((e): e is number => e !== null))];
  const eps = episodeIds.length
    ? await Episode.findAll({ where: { buildId: build.id, id: { [Op.in]: episodeIds } } })
    : [];
  const epById = new Map(eps.map((e) => [e.id, { id: e.id, number: e.number, title: e.title, state: e.state }]));
  const inBay = list
    .slice(0, inBayIds.length)
    .map((item) => ({ ...item, episode: epById.get(item.upgrade.episodeId ?? -1) ?? null }));
  return {
    episode: ep ? episodeOf(ep) : null,
    inBay,
    upgrades: list.slice(inBayIds.length),
    choices: choiceList,
    today: day,
  };
}
