// Publishing an episode: its chapter marks, the generated show notes, going live, the build's
// campaign name, and which parts shown in episodes still lack a product page link.
import { Op, QueryTypes } from 'sequelize';
import { sequelize, Episode, EpisodeChapter, Part, Upgrade, type Build } from '../models';
import { badRequest, notFound } from '../errors';
import { config } from '../config';
import { record, type Actor } from './activity';
import { afterGoLive, assertMayGoLive, type LiveActor } from './goLive';
import { toRecord, upgradeIdsByEpisode } from './episodes';
import { buildShowNotes, formatChapterTime, validateChapters } from '../../shared/showNotes';
import type { EpisodeState, PartCondition } from '../../shared/domain';
import type { Chapter } from '../../shared/contracts/publishing';
import type { PublishInput, PutChaptersInput } from '../../shared/schemas/publishing';
import type { Transaction } from 'sequelize';

async function episodeOf(buildId: number, episodeId: number, t?: Transaction, lock = false) {
  const ep = await Episode.findOne({
    where: { id: episodeId, buildId },
    transaction: t,
    ...(lock && t ? { lock: t.LOCK.UPDATE } : {}),
  });
  if (!ep) throw notFound('Episode');
  return ep;
}

async function chaptersOf(episodeId: number, t?: Transaction): Promise<Chapter[]> {
  const rows = await EpisodeChapter.findAll({ where: { episodeId }, order: [['position', 'ASC']], transaction: t });
  return rows.map((c) => ({ id: c.id, startSeconds: c.startSeconds, title: c.title, upgradeId: c.upgradeId }));
}

/** 400 naming every chapter row that is wrong, in the words of validateChapters. */
function refuseBadChapters(chapters: { startSeconds: number; title: string }[], runtime: number | null) {
  const problems = validateChapters(chapters, runtime);
  if (!problems.length) return;
  throw badRequest(
    `Check the chapters: ${problems.map((p) => `row ${p.index + 1}: ${p.message}`).join(' ')}`,
    problems.map((p) => ({ path: `chapters.${p.index}.${p.field}`, message: p.message })),
  );
}

export async function getChapters(buildId: number, episodeId: number) {
  const ep = await episodeOf(buildId, episodeId);
  const ids = (await upgradeIdsByEpisode(buildId)).get(ep.id) ?? [];
  return { chapters: await chaptersOf(ep.id), runtimeSeconds: ep.runtimeSeconds, episode: toRecord(ep, ids) };
}

export async function putChapters(actor: Actor, buildId: number, episodeId: number, input: PutChaptersInput) {
  return sequelize.transaction(async (t) => {
    const ep = await episodeOf(buildId, episodeId, t, true);
    const runtime = input.runtimeSeconds !== undefined ? input.runtimeSeconds : ep.runtimeSeconds;
    refuseBadChapters(input.chapters, runtime);
    const wanted = [...new Set(input.chapters.map((c) => c.upgradeId).filter((x): x is number => x !== null))];
    if (wanted.length) {
      const found = new Set(
        (
          await Upgrade.findAll({ where: { id: { [Op.in]: wanted }, buildId }, attributes: ['id'], transaction: t })
        ).map((u) => u.id),
      );
      const bad = input.chapters
        .map((c, i) => ({ c, i }))
        .filter(({ c }) => c.upgradeId !== null && !found.has(c.upgradeId));
      if (bad.length) {
        throw badRequest(
          `Chapter row ${bad.map((b) => b.i + 1).join(', ')} names an upgrade that is not in this build.`,
          bad.map((b) => ({ path: `chapters.${b.i}.upgradeId`, message: 'is not an upgrade of this build' })),
        );
      }
    }
    const before = await chaptersOf(ep.id, t);
    await EpisodeChapter.destroy({ where: { episodeId: ep.id }, transaction: t });
    await EpisodeChapter.bulkCreate(
      input.chapters.map((c, position) => ({
        episodeId: ep.id,
        position,
        startSeconds: c.startSeconds,
        title: c.title.trim(),
        upgradeId: c.upgradeId,
      })),
      { transaction: t },
    );
    if (runtime !== ep.runtimeSeconds) await ep.update({ runtimeSeconds: runtime ?? null }, { transaction: t });
    const after = await chaptersOf(ep.id, t);
    await record(t, {
      actor,
      buildId,
      entity: 'episode',
      entityId: ep.id,
      action: 'chapters',
      summary: `Set ${after.length} chapter${after.length === 1 ? '' : 's'} of episode ${ep.number}`,
      changes: {
        chapters: [
          before.map((c) => `${formatChapterTime(c.startSeconds)} ${c.title}`),
          after.map((c) => `${formatChapterTime(c.startSeconds)} ${c.title}`),
        ],
      },
    });
    return { chapters: after, runtimeSeconds: runtime ?? null };
  });
}

export const publicPageUrl = (build: Build) => (build.isPublic ? `${config().publicUrl}/b/${build.slug}` : null);
/** The campaign a link is tagged with: the build's own, or its slug when none is set. */
export const effectiveCampaign = (build: Build) => build.campaign || build.slug;

export async function showNotes(build: Build, episodeId: number) {
  const ep = await episodeOf(build.id, episodeId);
  const [chapters, upgrades] = await Promise.all([
    chaptersOf(ep.id),
    Upgrade.findAll({
      where: { buildId: build.id, episodeId: ep.id },
      order: [
        ['episodePosition', 'ASC'],
        ['id', 'ASC'],
      ],
    }),
  ]);
  const order = new Map(upgrades.map((u, i) => [u.id, i]));
  const parts = upgrades.length
    ? (
        await Part.findAll({
          where: {
            buildId: build.id,
            upgradeId: { [Op.in]: upgrades.map((u) => u.id) },
            state: { [Op.ne]: 'returned' },
          },
          order: [['id', 'ASC']],
        })
      ).sort((a, b) => order.get(a.upgradeId)! - order.get(b.upgradeId)! || a.id - b.id)
    : [];
  return buildShowNotes({
    title: `Episode ${ep.number}: ${ep.title}`,
    summary: ep.summary,
    chapters,
    parts: parts.map((p) => ({
      partNumber: p.partNumber,
      description: p.description,
      productUrl: p.productUrl,
      upgradeId: p.upgradeId,
    })),
    upgrades: upgrades.map((u) => ({ id: u.id, title: u.title, safetyFlags: u.safetyFlags })),
    campaign: effectiveCampaign(build),
    episodeNumber: ep.number,
    publicPageUrl: publicPageUrl(build),
    runtimeSeconds: ep.runtimeSeconds,
  });
}

export async function publish(actor: LiveActor, buildId: number, episodeId: number, input: PublishInput) {
  return sequelize.transaction(async (t) => {
    const ep = await episodeOf(buildId, episodeId, t, true);
    const runtime = input.runtimeSeconds ?? ep.runtimeSeconds;
    const chapters = await chaptersOf(ep.id, t);
    refuseBadChapters(chapters, runtime);
    const ids = (await upgradeIdsByEpisode(buildId, t)).get(ep.id) ?? [];
    const before = toRecord(ep, ids);
    const wasLive = ep.state === 'live';
    if (!wasLive) await assertMayGoLive(t, actor, ep, input.overrideReason);
    ep.state = 'live';
    ep.videoUrl = input.videoUrl;
    ep.runtimeSeconds = runtime ?? null;
    if (!ep.publishedAt) ep.publishedAt = new Date();
    await ep.save({ transaction: t });
    const after = toRecord(ep, ids);
    await record(t, {
      actor,
      buildId,
      entity: 'episode',
      entityId: ep.id,
      action: wasLive ? 'update' : 'publish',
      summary: wasLive
        ? `Changed the video of live episode ${ep.number}`
        : `Published episode ${ep.number}: ${ep.title}`,
      before: before as unknown as Record<string, unknown>,
      after: after as unknown as Record<string, unknown>,
    });
    // Once per person per episode (the mail queue's dedupe key), so a re-publish sends nothing new.
    if (!wasLive) await afterGoLive(t, ep);
    return after;
  });
}

export async function linkHealth(buildId: number) {
  const parts = await sequelize.query<Record<string, unknown>>(
    `SELECT p.id, p.part_number, p.description, p.condition, p.version, u.id AS upgrade_id, u.title AS upgrade_title,
            e.id AS episode_id, e.number AS episode_number, e.title AS episode_title, e.state AS episode_state
     FROM parts p JOIN upgrades u ON u.id = p.upgrade_id AND u.build_id = p.build_id
     JOIN episodes e ON e.id = u.episode_id AND e.build_id = u.build_id
     WHERE p.build_id = :buildId AND (p.product_url IS NULL OR p.product_url = '') AND p.state <> 'returned'
     ORDER BY e.number, u.episode_position NULLS LAST, p.id`,
    { replacements: { buildId }, type: QueryTypes.SELECT },
  );
  return {
    parts: parts.map((p) => ({
      id: p.id as number,
      partNumber: p.part_number as string,
      description: p.description as string,
      condition: p.condition as PartCondition,
      version: p.version as number,
      upgradeId: p.upgrade_id as number,
      upgradeTitle: p.upgrade_title as string,
      episodeId: p.episode_id as number,
      episodeNumber: p.episode_number as number,
      episodeTitle: p.episode_title as string,
      episodeState: p.episode_state as EpisodeState,
    })),
  };
}

export async function setCampaign(actor: Actor, build: Build, campaign: string | null) {
  return sequelize.transaction(async (t) => {
    await build.reload({ transaction: t, lock: t.LOCK.UPDATE });
    const before = build.campaign;
    if (before === campaign) return { campaign, effective: effectiveCampaign(build) };
    build.campaign = campaign;
    await build.save({ transaction: t });
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'build',
      entityId: build.id,
      action: 'campaign',
      summary: `Campaign set to ${campaign ?? `(none: links use ${build.slug})`}`,
      changes: { campaign: [before, campaign] },
    });
    return { campaign, effective: effectiveCampaign(build) };
  });
}
