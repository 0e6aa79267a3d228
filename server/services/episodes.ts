// Episodes of a build: create, change (state moves, dates, place in the series), delete, list.
// Numbers are always 1..n in series order; the unique (build_id, number) constraint is deferred,
// so renumbering inside one transaction never trips over itself.
import type { Transaction } from 'sequelize';
import { QueryTypes } from 'sequelize';
import { sequelize, Episode, type Build } from '../models';
import { AppError, badRequest, forbidden, notFound } from '../errors';
import { record, type Actor } from './activity';
import { afterGoLive, assertMayGoLive } from './goLive';
import { EPISODE_STATE_LABELS, type EpisodeRecord, type EpisodeState } from '../../shared/domain';
import { stateRank, type CreateEpisodeInput, type UpdateEpisodeInput } from '../../shared/schemas/episode';

/** States in which the episode has been filmed: its upgrades stay where they are. */
export const LOCKED_STATES: readonly EpisodeState[] = ['shot', 'in_edit', 'live'];

export interface EpisodeActor extends Actor {
  roles: readonly string[];
}

const label = (s: string) => EPISODE_STATE_LABELS[s as EpisodeState] ?? s;
const isProducer = (a: EpisodeActor) => a.roles.includes('owner') || a.roles.includes('producer');

export function toRecord(ep: Episode, upgradeIds: number[]): EpisodeRecord {
  return {
    id: ep.id,
    buildId: ep.buildId,
    number: ep.number,
    title: ep.title,
    summary: ep.summary,
    state: ep.state,
    shootDate: ep.shootDate,
    releaseDate: ep.releaseDate,
    videoUrl: ep.videoUrl,
    runtimeSeconds: ep.runtimeSeconds,
    publishedAt: ep.publishedAt ? new Date(ep.publishedAt).toISOString() : null,
    upgradeIds,
    version: ep.version,
  };
}

/** Upgrade ids per episode, in running order. */
export async function upgradeIdsByEpisode(buildId: number, t?: Transaction): Promise<Map<number, number[]>> {
  const rows = await sequelize.query<{ id: number; episode_id: number }>(
    `SELECT id, episode_id FROM upgrades WHERE build_id = :buildId AND episode_id IS NOT NULL
     ORDER BY episode_id, episode_position NULLS LAST, id`,
    { replacements: { buildId }, type: QueryTypes.SELECT, transaction: t },
  );
  const out = new Map<number, number[]>();
  for (const r of rows) {
    if (!out.has(r.episode_id)) out.set(r.episode_id, []);
    out.get(r.episode_id)!.push(r.id);
  }
  return out;
}

export async function listEpisodes(buildId: number, t?: Transaction): Promise<EpisodeRecord[]> {
  const [eps, ids] = await Promise.all([
    Episode.findAll({ where: { buildId }, order: [['number', 'ASC']], transaction: t }),
    upgradeIdsByEpisode(buildId, t),
  ]);
  return eps.map((e) => toRecord(e, ids.get(e.id) ?? []));
}

async function findEpisode(buildId: number, episodeId: number, t: Transaction) {
  const ep = await Episode.findOne({ where: { id: episodeId, buildId }, transaction: t, lock: t.LOCK.UPDATE });
  if (!ep) throw notFound('Episode');
  return ep;
}

/** Gives the build's episodes the numbers 1..n in the order of `orderedIds`. */
export async function renumber(buildId: number, orderedIds: number[], t: Transaction) {
  if (!orderedIds.length) return;
  const values = orderedIds.map((_, i) => `(:id${i}::int, ${i + 1})`).join(', ');
  const replacements: Record<string, number> = { buildId };
  orderedIds.forEach((id, i) => (replacements[`id${i}`] = id));
  await sequelize.query(
    `UPDATE episodes e SET number = v.n, updated_at = now() FROM (VALUES ${values}) AS v(id, n)
     WHERE e.id = v.id AND e.build_id = :buildId AND e.number <> v.n`,
    { replacements, transaction: t },
  );
}

async function orderedIds(buildId: number, t: Transaction): Promise<number[]> {
  const rows = await Episode.findAll({
    where: { buildId },
    attributes: ['id'],
    order: [
      ['number', 'ASC'],
      ['id', 'ASC'],
    ],
    transaction: t,
  });
  return rows.map((r) => r.id);
}

/** Moves episode `id` to place `number` (1-based, clamped) and renumbers the rest. */
async function moveTo(buildId: number, id: number, number: number, t: Transaction) {
  const ids = (await orderedIds(buildId, t)).filter((x) => x !== id);
  const at = Math.min(Math.max(number, 1), ids.length + 1) - 1;
  ids.splice(at, 0, id);
  await renumber(buildId, ids, t);
}

async function lockSeries(buildId: number, t: Transaction) {
  // One writer at a time per build's series, so two renumberings cannot interleave.
  await sequelize.query('SELECT id FROM builds WHERE id = :buildId FOR UPDATE', {
    replacements: { buildId },
    transaction: t,
  });
}

export async function createEpisode(actor: Actor, build: Build, input: CreateEpisodeInput): Promise<EpisodeRecord> {
  return sequelize.transaction(async (t) => {
    await lockSeries(build.id, t);
    const count = await Episode.count({ where: { buildId: build.id }, transaction: t });
    const ep = await Episode.create(
      {
        buildId: build.id,
        number: count + 1,
        title: input.title,
        summary: input.summary ?? null,
        shootDate: input.shootDate ?? null,
        releaseDate: input.releaseDate ?? null,
        videoUrl: null,
        runtimeSeconds: null,
        publishedAt: null,
      },
      { transaction: t },
    );
    if (input.number && input.number <= count) await moveTo(build.id, ep.id, input.number, t);
    await ep.reload({ transaction: t });
    const rec = toRecord(ep, []);
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'episode',
      entityId: ep.id,
      action: 'create',
      summary: `Added episode ${ep.number}: ${ep.title}`,
      after: rec as unknown as Record<string, unknown>,
    });
    return rec;
  });
}

const INSTALLER_FIELDS = new Set(['state', 'version']);

export async function updateEpisode(
  actor: EpisodeActor,
  build: Build,
  episodeId: number,
  input: UpdateEpisodeInput,
): Promise<EpisodeRecord> {
  const producer = isProducer(actor);
  if (!producer) {
    // The installer marks an episode shot from the shop floor; everything else is the producer's.
    const other = Object.keys(input).filter((k) => !INSTALLER_FIELDS.has(k));
    if (other.length) throw forbidden(`Your role may only move the episode's state forward (not ${other.join(', ')}).`);
  }
  return sequelize.transaction(async (t) => {
    await lockSeries(build.id, t);
    const ep = await findEpisode(build.id, episodeId, t);
    const ids = (await upgradeIdsByEpisode(build.id, t)).get(ep.id) ?? [];
    const before = toRecord(ep, ids);
    if (ep.version !== input.version) {
      throw new AppError(
        409,
        'stale',
        'Someone else changed this episode since you loaded it. Their version is shown.',
        undefined,
        { current: before },
      );
    }
    const to = input.state ?? ep.state;
    const goesLive = to === 'live' && ep.state !== 'live';
    // The same rule as the publishing route: who may, and only a finished episode (or a reason).
    if (goesLive) await assertMayGoLive(t, actor, ep, input.overrideReason);
    if (stateRank(to) < stateRank(ep.state) && !producer) {
      throw new AppError(
        409,
        'backward_move',
        `Episode ${ep.number} is ${label(ep.state)}; only a producer or owner may move it back to ${label(to)}.`,
      );
    }
    if (input.title !== undefined) ep.title = input.title;
    if (input.summary !== undefined) ep.summary = input.summary;
    if (input.shootDate !== undefined) ep.shootDate = input.shootDate;
    if (input.releaseDate !== undefined) ep.releaseDate = input.releaseDate;
    if (input.videoUrl !== undefined) ep.videoUrl = input.videoUrl;
    if (input.runtimeSeconds !== undefined) ep.runtimeSeconds = input.runtimeSeconds;
    if (ep.shootDate && ep.releaseDate && ep.releaseDate < ep.shootDate) {
      throw badRequest('The release date must be on or after the shoot date.', [
        { path: 'releaseDate', message: 'must be on or after the shoot date' },
      ]);
    }
    if (stateRank(to) >= stateRank('scheduled') && !ep.shootDate) {
      throw badRequest(`Give episode ${ep.number} a shoot date before it is ${label(to)}.`, [
        { path: 'shootDate', message: `is needed once the episode is ${label(to)}` },
      ]);
    }
    if (to === 'live' && !ep.videoUrl) {
      throw badRequest('An episode goes live with its video address.', [
        { path: 'videoUrl', message: 'is needed to go live' },
      ]);
    }
    ep.state = to;
    if (goesLive && !ep.publishedAt) ep.publishedAt = new Date();
    if (to !== 'live' && before.state === 'live') ep.publishedAt = null;
    ep.changed('updatedAt', true);
    await ep.save({ transaction: t });
    if (input.number !== undefined && input.number !== ep.number) await moveTo(build.id, ep.id, input.number, t);
    await ep.reload({ transaction: t });
    const after = toRecord(ep, ids);
    if (before.state !== after.state) {
      await record(t, {
        actor,
        buildId: build.id,
        entity: 'episode',
        entityId: ep.id,
        action: 'state',
        summary: `Episode ${ep.number} moved from ${label(before.state)} to ${label(after.state)}`,
        changes: { state: [before.state, after.state] },
      });
    }
    const { state: _s, ...rest } = after;
    const { state: _b, ...restBefore } = before;
    const changes = JSON.stringify(rest) !== JSON.stringify(restBefore);
    if (changes) {
      await record(t, {
        actor,
        buildId: build.id,
        entity: 'episode',
        entityId: ep.id,
        action: 'update',
        summary: `Changed episode ${ep.number}: ${ep.title}`,
        before: restBefore,
        after: rest,
      });
    }
    if (goesLive) await afterGoLive(t, ep);
    return after;
  });
}

export async function deleteEpisode(actor: Actor, build: Build, episodeId: number): Promise<void> {
  await sequelize.transaction(async (t) => {
    await lockSeries(build.id, t);
    const ep = await findEpisode(build.id, episodeId, t);
    if (LOCKED_STATES.includes(ep.state)) {
      throw new AppError(
        409,
        'episode_locked',
        `Episode ${ep.number} is ${label(ep.state)}: it has been filmed and stays in the series.`,
      );
    }
    const ids = (await upgradeIdsByEpisode(build.id, t)).get(ep.id) ?? [];
    await sequelize.query(
      `UPDATE upgrades SET episode_id = NULL, episode_position = NULL, version = version + 1, updated_at = now()
       WHERE build_id = :buildId AND episode_id = :id`,
      { replacements: { buildId: build.id, id: ep.id }, transaction: t },
    );
    const before = toRecord(ep, ids);
    await ep.destroy({ transaction: t });
    await renumber(build.id, await orderedIds(build.id, t), t);
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'episode',
      entityId: episodeId,
      action: 'delete',
      summary: `Deleted episode ${before.number}: ${before.title}${ids.length ? ` (${ids.length} upgrades back to unplanned)` : ''}`,
      before: before as unknown as Record<string, unknown>,
    });
  });
}
