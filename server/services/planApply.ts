// Applying the episode plan of a build: a hand-made order or an accepted proposal, checked whole and
// written in one transaction with its revision, and the undo of the last apply. Reading and proposing
// the plan is plan.ts.
import { QueryTypes, type Transaction } from 'sequelize';
import { sequelize, Episode, type Build } from '../models';
import { AppError, badRequest, type FieldError } from '../errors';
import { record, type Actor } from './activity';
import { LOCKED_STATES, listEpisodes, renumber } from './episodes';
import { capacityOf, currentPlan, loadPlanData, plannerInput, type PlanData } from './planData';
import { refuseCycle } from './plan';
import { validatePlan } from '../../shared/planner/index';
import type { PlanInputBody } from '../../shared/schemas/episode';
import { assertPlanVersion, recordRevision, refuseUnlistedDateChanges, undoLastChange } from './planRevisions';

/**
 * Applies a whole plan: the listed episodes in order become numbers 1..k (episodes not listed follow
 * in their present order, emptied unless filmed), each with exactly the listed upgrades in order.
 * Everything is checked before anything is written; violations of the planner's rules are allowed
 * (a producer may decide to) and returned.
 */
export async function applyPlan(actor: Actor, build: Build, body: PlanInputBody) {
  return sequelize.transaction(async (t) => {
    await sequelize.query('SELECT id FROM builds WHERE id = :id FOR UPDATE', {
      replacements: { id: build.id },
      transaction: t,
    });
    // A plan made from an older version (another apply or undo came first) is refused whole.
    await assertPlanVersion(t, build.id, body.basedOn);
    const data = await loadPlanData(build, t);
    const result = await applyLoadedPlan(t, actor, build, data, body);
    await recordRevision(t, actor, build.id, 'apply', data, result.after);
    return { episodes: result.episodes, violations: result.violations, planVersion: body.basedOn + 1 };
  });
}

/**
 * The writing part of an apply, inside the caller's transaction with the build locked: checks
 * everything first, then writes. Also used by undo to restore an earlier plan.
 */
export async function applyLoadedPlan(
  t: Transaction,
  actor: Actor,
  build: Build,
  data: PlanData,
  body: Omit<PlanInputBody, 'basedOn'>,
) {
  const epById = new Map(data.episodes.map((e) => [e.id, e]));
  const upById = new Map(data.upgrades.map((u) => [u.id, u]));
  const fields: FieldError[] = [];
  const seenEp = new Set<number>();
  const seenUp = new Map<number, string>();
  body.episodes.forEach((e, i) => {
    if (e.id !== undefined) {
      if (!epById.has(e.id)) fields.push({ path: `episodes.${i}.id`, message: 'is not an episode of this build' });
      else if (seenEp.has(e.id)) fields.push({ path: `episodes.${i}.id`, message: 'is listed twice' });
      seenEp.add(e.id);
    }
    if (e.id === undefined && !e.title)
      fields.push({ path: `episodes.${i}.title`, message: 'is required for a new episode' });
    const existing = e.id !== undefined ? epById.get(e.id) : undefined;
    const shoot = e.shootDate !== undefined ? e.shootDate : (existing?.shootDate ?? null);
    const release = e.releaseDate !== undefined ? e.releaseDate : (existing?.releaseDate ?? null);
    if (shoot && release && release < shoot)
      fields.push({ path: `episodes.${i}.releaseDate`, message: 'must be on or after the shoot date' });
    e.upgradeIds.forEach((uid, j) => {
      const path = `episodes.${i}.upgradeIds.${j}`;
      if (!upById.has(uid)) fields.push({ path, message: 'is not an upgrade of this build' });
      else if (seenUp.has(uid)) fields.push({ path, message: `is already in ${seenUp.get(uid)}` });
      else seenUp.set(uid, `episodes.${i}`);
    });
  });
  if (fields.length) throw badRequest(`Check these fields: ${fields.map((f) => f.path).join(', ')}.`, fields);
  refuseUnlistedDateChanges(data, body);

  // A filmed episode keeps exactly what was filmed.
  const listed = new Map(body.episodes.filter((e) => e.id !== undefined).map((e) => [e.id!, e.upgradeIds]));
  for (const ep of data.episodes) {
    if (!LOCKED_STATES.includes(ep.state)) continue;
    const after = listed.get(ep.id) ?? ep.upgradeIds.filter((id) => !seenUp.has(id));
    if (JSON.stringify(after) !== JSON.stringify(ep.upgradeIds)) {
      throw new AppError(
        409,
        'episode_locked',
        `Episode ${ep.number} (${ep.title}) has been filmed; its upgrades cannot change.`,
        undefined,
        { episodeId: ep.id },
      );
    }
  }
  refuseCycle(data);

  // Write: new episodes, numbers, dates, then upgrade assignments.
  const order: number[] = [];
  const assignment = new Map<number, { episodeId: number; position: number }>();
  let tempNumber = data.episodes.length;
  for (const e of body.episodes) {
    let epId = e.id;
    if (epId === undefined) {
      const created = await Episode.create(
        {
          buildId: build.id,
          number: ++tempNumber,
          title: e.title!,
          summary: null,
          shootDate: e.shootDate ?? null,
          releaseDate: e.releaseDate ?? null,
          videoUrl: null,
          runtimeSeconds: null,
          publishedAt: null,
        },
        { transaction: t },
      );
      epId = created.id;
      await record(t, {
        actor,
        buildId: build.id,
        entity: 'episode',
        entityId: epId,
        action: 'create',
        summary: `Added episode "${created.title}" with the plan`,
        after: { title: created.title, shootDate: created.shootDate, releaseDate: created.releaseDate },
      });
    } else if (e.shootDate !== undefined || e.releaseDate !== undefined || e.title !== undefined) {
      const ep = await Episode.findOne({ where: { id: epId, buildId: build.id }, transaction: t });
      const before = { title: ep!.title, shootDate: ep!.shootDate, releaseDate: ep!.releaseDate };
      if (e.title !== undefined) ep!.title = e.title;
      if (e.shootDate !== undefined) ep!.shootDate = e.shootDate;
      if (e.releaseDate !== undefined) ep!.releaseDate = e.releaseDate;
      if (ep!.changed()) {
        await ep!.save({ transaction: t });
        await record(t, {
          actor,
          buildId: build.id,
          entity: 'episode',
          entityId: epId,
          action: 'update',
          summary: `Changed episode "${ep!.title}" with the plan`,
          before,
          after: { title: ep!.title, shootDate: ep!.shootDate, releaseDate: ep!.releaseDate },
        });
      }
    }
    order.push(epId);
    e.upgradeIds.forEach((uid, position) => assignment.set(uid, { episodeId: epId!, position }));
  }
  for (const ep of data.episodes) {
    if (order.includes(ep.id)) continue;
    order.push(ep.id);
    if (LOCKED_STATES.includes(ep.state))
      ep.upgradeIds.forEach((uid, position) => assignment.set(uid, { episodeId: ep.id, position }));
  }
  await renumber(build.id, order, t);

  const changes: Record<string, [unknown, unknown]> = {};
  const moved = data.upgrades.filter((u) => {
    const a = assignment.get(u.id);
    return (a?.episodeId ?? null) !== u.episodeId || (a?.position ?? null) !== u.episodePosition;
  });
  if (moved.length) {
    const values = moved.map((_, i) => `(:u${i}::int, :e${i}::int, :p${i}::int)`).join(', ');
    const replacements: Record<string, number | null> = { buildId: build.id };
    moved.forEach((u, i) => {
      const a = assignment.get(u.id);
      replacements[`u${i}`] = u.id;
      replacements[`e${i}`] = a?.episodeId ?? null;
      replacements[`p${i}`] = a?.position ?? null;
      changes[u.title] = [
        u.episodeId ? (epById.get(u.episodeId)?.number ?? null) : null,
        a ? order.indexOf(a.episodeId) + 1 : null,
      ];
    });
    // Bumping the version makes an upgrade form opened before the plan changed answer 409.
    await sequelize.query(
      `UPDATE upgrades u SET episode_id = v.e, episode_position = v.p, version = u.version + 1, updated_at = now()
         FROM (VALUES ${values}) AS v(id, e, p) WHERE u.id = v.id AND u.build_id = :buildId`,
      { replacements, transaction: t, type: QueryTypes.UPDATE },
    );
  }
  const movedCount = Object.values(changes).filter(([a, b]) => a !== b).length;
  await record(t, {
    actor,
    buildId: build.id,
    entity: 'plan',
    entityId: build.id,
    action: 'apply',
    summary: `Applied a plan of ${order.length} episodes (${movedCount} upgrades changed episode)`,
    changes,
  });
  const after = await loadPlanData(build, t);
  return {
    after,
    episodes: await listEpisodes(build.id, t),
    violations: validatePlan(plannerInput(after, capacityOf(build), false), currentPlan(after)),
  };
}

/** Takes back the last applied plan change (see planRevisions). */
export function undoLastPlanChange(actor: Actor, build: Build, basedOn: number) {
  return undoLastChange(actor, build, basedOn, applyLoadedPlan);
}
