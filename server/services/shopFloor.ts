// The installer's view of the episode being worked: its upgrades in running order with their parts,
// safety cautions and whether their prerequisites are installed (and if not, which ones block them).
import { Op } from 'sequelize';
import { Episode, Part, Upgrade, UpgradePrerequisite, type Build } from '../models';
import { notFound } from '../errors';
import { forViewer, type Viewer } from './visibility';
import { toRecord, upgradeIdsByEpisode } from './episodes';
import { cautionsFor } from '../../shared/safety';
import { toPartRecord, toUpgradeRecord } from './backlogRecords';
import type { EpisodeRecord, PartRecord, UpgradeRecord } from '../../shared/domain';

/** States an installer works in: about to be shot, or shot with pick-up work left. */
const WORKING_STATES = ['scheduled', 'shot', 'in_edit'] as const;

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
  const candidates = await Episode.findAll({ where: { buildId, state: { [Op.in]: [...WORKING_STATES] } }, order: [['number', 'ASC']] });
  const rank = (e: Episode) => WORKING_STATES.indexOf(e.state as (typeof WORKING_STATES)[number]);
  candidates.sort((a, b) => rank(a) - rank(b) || (a.shootDate ?? '9999').localeCompare(b.shootDate ?? '9999') || a.number - b.number);
  return candidates[0] ?? null;
}

export async function shopFloor(build: Build, viewer: Viewer, episodeId?: number) {
  const [ep, choices, idsByEpisode] = await Promise.all([
    pickEpisode(build.id, episodeId),
    Episode.findAll({ where: { buildId: build.id, state: { [Op.in]: [...WORKING_STATES] } }, order: [['number', 'ASC']] }),
    upgradeIdsByEpisode(build.id),
  ]);
  const episodeOf = (e: Episode): EpisodeRecord => toRecord(e, idsByEpisode.get(e.id) ?? []);
  const choiceList = choices.map((e) => ({ id: e.id, number: e.number, title: e.title, state: e.state, shootDate: e.shootDate }));
  if (!ep) return { episode: null, upgrades: [], choices: choiceList };

  const ids = idsByEpisode.get(ep.id) ?? [];
  const [ups, parts, edges] = await Promise.all([
    Upgrade.findAll({ where: { buildId: build.id, id: { [Op.in]: ids } } }),
    Part.findAll({ where: { buildId: build.id, upgradeId: { [Op.in]: ids } }, order: [['id', 'ASC']] }),
    UpgradePrerequisite.findAll({ where: { buildId: build.id, upgradeId: { [Op.in]: ids } } }),
  ]);
  const prereqIds = [...new Set(edges.map((e) => e.prerequisiteId))];
  const prereqs = prereqIds.length
    ? await Upgrade.findAll({ where: { buildId: build.id, id: { [Op.in]: prereqIds } }, attributes: ['id', 'title', 'installState'] })
    : [];
  const prereqById = new Map(prereqs.map((p) => [p.id, p]));
  const byId = new Map(ups.map((u) => [u.id, u]));

  const upgrades = ids.map((id) => {
    const u = byId.get(id)!;
    const mine = edges.filter((e) => e.upgradeId === id).map((e) => e.prerequisiteId);
    const blocked = mine.map((p) => prereqById.get(p)).filter((p) => p && p.installState !== 'installed');
    return {
      upgrade: forViewer(toUpgradeRecord(u, mine), viewer) as UpgradeRecord,
      parts: parts.filter((p) => p.upgradeId === id).map((p) => forViewer(toPartRecord(p), viewer) as PartRecord),
      prerequisitesMet: blocked.length === 0,
      blockedBy: blocked.map((p) => p!.title),
      cautions: cautionsFor(u.safetyFlags),
    };
  });
  return { episode: episodeOf(ep), upgrades, choices: choiceList };
}
