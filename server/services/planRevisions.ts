// The plan's history: every applied plan is a revision (1, 2, 3 … per build) with the plan before
// and after it. A change names the version it was made from, so a second concurrent apply answers
// 409 and writes nothing; the last change can be undone unless something it moved was filmed since.
import { QueryTypes, type Transaction } from 'sequelize';
import { sequelize, Episode, PlanRevision, type Build } from '../models';
import type { PlanSnapshot } from '../models/planRevision';
import { AppError } from '../errors';
import { record, type Actor } from './activity';
import { LOCKED_STATES, listEpisodes, renumber } from './episodes';
import { loadPlanData, type PlanData } from './planData';
import {
  planChangeLine,
  summarizePlanChange,
  type PlanChangeSummary,
  type PlanSideEpisode,
} from '../../shared/planChange';
import { EPISODE_STATE_LABELS, type EpisodeState } from '../../shared/domain';
import type { PlanInputBody } from '../../shared/schemas/episode';

/** The build's plan version: the number of its last revision, 0 before any. */
export async function planVersion(buildId: number, t?: Transaction): Promise<number> {
  const [row] = await sequelize.query<{ n: number }>(
    'SELECT coalesce(max(number), 0)::int AS n FROM plan_revisions WHERE build_id = :buildId',
    {
      replacements: { buildId },
      type: QueryTypes.SELECT,
      transaction: t,
    },
  );
  return row?.n ?? 0;
}

/** 409 unless the change was made from the current version. Call with the build row locked. */
export async function assertPlanVersion(t: Transaction, buildId: number, basedOn: number) {
  const current = await planVersion(buildId, t);
  if (current === basedOn) return;
  const last = await PlanRevision.findOne({ where: { buildId, number: current }, transaction: t });
  const who = last
    ? ` (${last.kind === 'undo' ? 'an undo' : 'a change'} by ${last.userName ?? 'someone'} at ${last.createdAt.toISOString().slice(11, 16)} UTC)`
    : '';
  throw new AppError(
    409,
    'plan_changed',
    `The plan changed since you loaded it${who}. Nothing was written; reload the planner and look again.`,
    undefined,
    { planVersion: current },
  );
}

const label = (s: string | null) => (s ? (EPISODE_STATE_LABELS[s as EpisodeState] ?? s) : 'new');

/**
 * A plan never changes the dates of a scheduled (or later) episode unless the change says so:
 * `acceptDateChanges` must name each such episode, as the summary listed it.
 */
export function refuseUnlistedDateChanges(data: PlanData, body: Omit<PlanInputBody, 'basedOn'>) {
  const accepted = new Set(body.acceptDateChanges ?? []);
  const byId = new Map(data.episodes.map((e) => [e.id, e]));
  const unlisted: string[] = [];
  for (const e of body.episodes) {
    const ep = e.id !== undefined ? byId.get(e.id) : undefined;
    if (!ep || ep.state === 'draft' || accepted.has(ep.id)) continue;
    const shoot = e.shootDate !== undefined && e.shootDate !== ep.shootDate;
    const release = e.releaseDate !== undefined && e.releaseDate !== ep.releaseDate;
    if (shoot || release) {
      const parts = [
        shoot ? `shoot ${ep.shootDate ?? 'none'} → ${e.shootDate ?? 'none'}` : '',
        release ? `release ${ep.releaseDate ?? 'none'} → ${e.releaseDate ?? 'none'}` : '',
      ].filter(Boolean);
      unlisted.push(`episode ${ep.number} (${ep.title}, ${label(ep.state)}): ${parts.join(', ')}`);
    }
  }
  if (unlisted.length) {
    throw new AppError(
      409,
      'unlisted_date_change',
      `This plan changes the dates of ${unlisted.join('; ')}. Confirm these date changes to apply it.`,
      undefined,
      { episodes: unlisted },
    );
  }
}

async function segmentsOf(buildId: number, t?: Transaction) {
  const rows = await sequelize.query<{ id: number; install_segment: string; demo_segment: string }>(
    'SELECT id, install_segment, demo_segment FROM upgrades WHERE build_id = :buildId',
    { replacements: { buildId }, type: QueryTypes.SELECT, transaction: t },
  );
  return Object.fromEntries(
    rows.map((r) => [r.id, { installSegment: r.install_segment, demoSegment: r.demo_segment }]),
  );
}

async function snapshot(data: PlanData, t?: Transaction): Promise<PlanSnapshot> {
  return {
    episodes: data.episodes.map((e) => ({
      id: e.id,
      number: e.number,
      title: e.title,
      state: e.state,
      shootDate: e.shootDate,
      releaseDate: e.releaseDate,
      upgradeIds: [...e.upgradeIds],
    })),
    segments: await segmentsOf(data.build.id, t),
  };
}

const titleLookup = (data: PlanData) => {
  const titles = new Map(data.upgrades.map((u) => [u.id, u.title]));
  return (id: number) => titles.get(id) ?? `#${id}`;
};

/** What a proposed plan changes compared with the current one. */
export function changeSummary(data: PlanData, proposed: PlanSideEpisode[]): PlanChangeSummary {
  return summarizePlanChange(data.episodes, proposed, titleLookup(data));
}

export async function recordRevision(
  t: Transaction,
  actor: Actor,
  buildId: number,
  kind: 'apply' | 'undo',
  before: PlanData,
  after: PlanData,
  undoesId: number | null = null,
) {
  const number = (await planVersion(buildId, t)) + 1;
  const [b, a] = await Promise.all([snapshot(before, t), snapshot(after, t)]);
  const line = planChangeLine(summarizePlanChange(before.episodes, after.episodes, titleLookup(after)));
  return PlanRevision.create(
    {
      buildId,
      number,
      kind,
      undoesId,
      before: b,
      after: a,
      summary: `${kind === 'undo' ? 'Undid the last plan change' : 'Applied a plan'}: ${line}`.slice(0, 1000),
      userId: actor.id,
      userName: actor.name,
    },
    { transaction: t },
  );
}

/** The plan change "Undo" would take back: the latest applied one not undone yet. */
export async function lastUndoable(buildId: number, t?: Transaction) {
  return PlanRevision.findOne({
    where: { buildId, kind: 'apply', undoneAt: null },
    order: [['number', 'DESC']],
    transaction: t,
  });
}

export async function listRevisions(buildId: number) {
  const rows = await PlanRevision.findAll({ where: { buildId }, order: [['number', 'DESC']], limit: 50 });
  return rows.map((r) => ({
    number: r.number,
    kind: r.kind,
    summary: r.summary,
    userName: r.userName,
    createdAt: r.createdAt.toISOString(),
    undone: !!r.undoneAt,
  }));
}

/** What was filmed since `target` that its undo would move: episodes now filmed, segments now shot. */
function filmedSince(target: PlanRevision, data: PlanData, segmentsNow: PlanSnapshot['segments']): string[] {
  const out: string[] = [];
  const then = new Map(target.after.episodes.map((e) => [e.id, e]));
  const touched = new Set<number>();
  const change = summarizePlanChange(target.before.episodes, target.after.episodes, (id) => String(id));
  for (const m of change.moved) touched.add(m.upgradeId);
  for (const ep of data.episodes) {
    const was = then.get(ep.id);
    if (!was) continue;
    const touchedHere =
      ep.upgradeIds.some((u) => touched.has(u)) ||
      target.before.episodes.find((e) => e.id === ep.id)?.upgradeIds.some((u) => touched.has(u));
    if (touchedHere && LOCKED_STATES.includes(ep.state) && !LOCKED_STATES.includes(was.state as EpisodeState))
      out.push(`episode ${ep.number} (${ep.title}) was marked ${label(ep.state)}`);
  }
  const title = titleLookup(data);
  for (const id of touched) {
    const before = target.after.segments[id];
    const now = segmentsNow[id];
    if (!before || !now) continue;
    if (now.installSegment === 'shot' && before.installSegment !== 'shot')
      out.push(`the install segment of ${title(id)} was shot`);
    if (now.demoSegment === 'shot' && before.demoSegment !== 'shot')
      out.push(`the demo segment of ${title(id)} was shot`);
  }
  return out;
}

type ApplyFn = (
  t: Transaction,
  actor: Actor,
  build: Build,
  data: PlanData,
  body: Omit<PlanInputBody, 'basedOn'>,
) => Promise<{ after: PlanData; episodes: unknown; violations: unknown }>;

/** Restores the plan as it was before the last applied change, in one transaction. */
export async function undoLastChange(actor: Actor, build: Build, basedOn: number, apply: ApplyFn) {
  return sequelize.transaction(async (t) => {
    await sequelize.query('SELECT id FROM builds WHERE id = :id FOR UPDATE', {
      replacements: { id: build.id },
      transaction: t,
    });
    await assertPlanVersion(t, build.id, basedOn);
    const target = await lastUndoable(build.id, t);
    if (!target) throw new AppError(409, 'nothing_to_undo', 'There is no plan change to undo.');
    const data = await loadPlanData(build, t);
    const blockers = filmedSince(target, data, await segmentsOf(build.id, t));
    if (blockers.length) {
      throw new AppError(
        409,
        'undo_blocked',
        `The last plan change cannot be undone: since then ${blockers.join('; ')}. Move those upgrades by hand if needed.`,
        undefined,
        { blockers },
      );
    }
    const existingEp = new Set(data.episodes.map((e) => e.id));
    const existingUp = new Set(data.upgrades.map((u) => u.id));
    const restore = target.before.episodes.filter((e) => existingEp.has(e.id));
    await apply(t, actor, build, data, {
      episodes: restore.map((e) => ({
        id: e.id,
        title: e.title,
        shootDate: e.shootDate,
        releaseDate: e.releaseDate,
        upgradeIds: e.upgradeIds.filter((u) => existingUp.has(u)),
      })),
      acceptDateChanges: restore.map((e) => e.id),
    });
    // Episodes that change added, now empty again, go away with it.
    const added = target.after.episodes
      .filter((e) => !target.before.episodes.some((b) => b.id === e.id))
      .map((e) => e.id);
    if (added.length) {
      const counts = await sequelize.query<{ id: number; n: number }>(
        'SELECT e.id, (SELECT count(*)::int FROM upgrades u WHERE u.episode_id = e.id) AS n FROM episodes e WHERE e.build_id = :buildId AND e.id IN (:ids)',
        { replacements: { buildId: build.id, ids: added }, type: QueryTypes.SELECT, transaction: t },
      );
      const empty = counts.filter((c) => c.n === 0).map((c) => c.id);
      if (empty.length)
        await Episode.destroy({ where: { buildId: build.id, id: empty, state: 'draft' }, transaction: t });
      const left = await Episode.findAll({
        where: { buildId: build.id },
        attributes: ['id'],
        order: [['number', 'ASC']],
        transaction: t,
      });
      await renumber(
        build.id,
        left.map((e) => e.id),
        t,
      );
    }
    await target.update({ undoneAt: new Date() }, { transaction: t });
    const after = await loadPlanData(build, t);
    const rev = await recordRevision(t, actor, build.id, 'undo', data, after, target.id);
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'plan',
      entityId: build.id,
      action: 'undo',
      summary: `Undid plan change ${target.number}: ${target.summary}`.slice(0, 1000),
      changes: {},
    });
    return {
      episodes: await listEpisodes(build.id, t),
      planVersion: rev.number,
      undone: { number: target.number, summary: target.summary },
    };
  });
}
