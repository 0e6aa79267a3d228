// Slip alerts and baselines (issue 11, deliverable 5): loads what computeSlips needs, and when parts
// move later or go overdue, writes notices for producers and queues at most one digest a day per build.
import { QueryTypes, type Transaction } from 'sequelize';
import { sequelize, type Build } from '../models';
import { config } from '../config';
import { enqueueMail } from '../mail/outbox';
import { slipDigestMail } from '../mail/slipDigest';
import { today } from './planData';
import { daysBetween } from '../../shared/dates';
import {
  computeSlips,
  type EpisodeSlip,
  type SlipEpisode,
  type SlipPart,
  type SlipUpgrade,
} from '../../shared/planner/slips';
import type { Notice } from '../../shared/contracts/slips';

/** The build fields slips read: its zone gives "today" (parts overdue, releases at risk). */
type BuildRef = Pick<Build, 'id' | 'name'> & Partial<Pick<Build, 'timeZone'>>;

/** Every episode of the build with baseline, plan and projection, in series order. */
export async function loadSlips(buildId: number, t: Transaction | undefined, now: string): Promise<EpisodeSlip[]> {
  const replacements = { buildId };
  const q = <R extends object>(sql: string) =>
    sequelize.query<R>(sql, { replacements, type: QueryTypes.SELECT, transaction: t });
  const [episodes, upgrades, edges, parts] = await Promise.all([
    q<SlipEpisode>(
      `SELECT id, number, title, state,
              to_char(shoot_date, 'YYYY-MM-DD') AS "shootDate", to_char(release_date, 'YYYY-MM-DD') AS "releaseDate",
              to_char(baseline_shoot_date, 'YYYY-MM-DD') AS "baselineShootDate", to_char(baseline_release_date, 'YYYY-MM-DD') AS "baselineReleaseDate"
         FROM episodes WHERE build_id = :buildId ORDER BY number`,
    ),
    q<{ id: number; title: string; install_state: string; episode_id: number | null }>(
      'SELECT id, title, install_state, episode_id FROM upgrades WHERE build_id = :buildId',
    ),
    q<{ upgrade_id: number; prerequisite_id: number }>(
      'SELECT upgrade_id, prerequisite_id FROM upgrade_prerequisites WHERE build_id = :buildId',
    ),
    q<SlipPart>(
      `SELECT id, upgrade_id AS "upgradeId", part_number AS "partNumber", description, to_char(expected_arrival, 'YYYY-MM-DD') AS "expectedArrival"
         FROM parts WHERE build_id = :buildId AND state NOT IN ('received','fitted','returned')`,
    ),
  ]);
  const prereqs = new Map<number, number[]>();
  for (const e of edges)
    (prereqs.get(e.upgrade_id) ?? prereqs.set(e.upgrade_id, []).get(e.upgrade_id)!).push(e.prerequisite_id);
  const ups: SlipUpgrade[] = upgrades.map((u) => ({
    id: u.id,
    title: u.title,
    installed: u.install_state === 'installed',
    episodeId: u.episode_id,
    prerequisiteIds: prereqs.get(u.id) ?? [],
  }));
  return computeSlips({ today: now, episodes, upgrades: ups, parts });
}

/** Parts past their expected arrival and not in, for notices and the digest. */
async function overdueParts(buildId: number, now: string, t?: Transaction) {
  return sequelize.query<{
    id: number;
    partNumber: string;
    description: string;
    upgradeTitle: string;
    expectedArrival: string;
  }>(
    `SELECT p.id, p.part_number AS "partNumber", p.description, u.title AS "upgradeTitle", to_char(p.expected_arrival, 'YYYY-MM-DD') AS "expectedArrival"
       FROM parts p JOIN upgrades u ON u.id = p.upgrade_id
      WHERE p.build_id = :buildId AND p.state NOT IN ('received','fitted','returned') AND u.install_state <> 'installed'
        AND p.expected_arrival < :now ORDER BY p.expected_arrival, p.id`,
    { replacements: { buildId, now }, type: QueryTypes.SELECT, transaction: t },
  );
}

async function addNotice(
  t: Transaction,
  buildId: number,
  kind: string,
  message: string,
  data: object,
  dedupeKey: string,
): Promise<boolean> {
  const [rows] = await sequelize.query(
    `INSERT INTO notices (build_id, kind, message, data, dedupe_key) VALUES (:buildId, :kind, :message, :data::jsonb, :dedupeKey)
     ON CONFLICT (build_id, dedupe_key) DO NOTHING RETURNING id`,
    {
      replacements: { buildId, kind, message: message.slice(0, 1000), data: JSON.stringify(data), dedupeKey },
      transaction: t,
    },
  );
  return (rows as unknown[]).length > 0;
}

export function describeSlip(s: EpisodeSlip): string {
  const c = s.cause!;
  const why = c.overdue
    ? `${c.partNumber} (${c.description}) for ${c.upgradeTitle} is overdue since ${c.expectedArrival}`
    : `${c.partNumber} (${c.description}) for ${c.upgradeTitle} is now due ${c.expectedArrival}`;
  return `Episode ${s.number}, "${s.title}": release ${s.planned.releaseDate ?? 'not set'} at risk by ${s.partsDelayDays} day${s.partsDelayDays === 1 ? '' : 's'} (shoot ${s.planned.shootDate} → ${s.projected.shootDate}). ${why}.`;
}

/**
 * Recomputes slips after a part's date or state moved, or on a look at the planner (parts go overdue
 * as days pass, with no write to notice it). New findings become notices — one per episode and
 * projected release, one per overdue part and date — and, when there is any new one, producers get
 * the day's digest, at most once a day per build (the outbox's dedupe key holds the build and day).
 */
export async function refreshSlipNotices(
  t: Transaction,
  build: BuildRef,
  now: string = today(build.timeZone),
): Promise<number> {
  const [slips, overdue] = await Promise.all([loadSlips(build.id, t, now), overdueParts(build.id, now, t)]);
  const atRisk = slips.filter((s) => s.releaseAtRisk);
  let added = 0;
  for (const s of atRisk) {
    const data = {
      episodeId: s.episodeId,
      days: s.partsDelayDays,
      projectedReleaseDate: s.projected.releaseDate,
      partId: s.cause!.partId,
    };
    if (
      await addNotice(
        t,
        build.id,
        'release_at_risk',
        describeSlip(s),
        data,
        `risk:${s.episodeId}:${s.projected.shootDate}`,
      )
    )
      added++;
  }
  for (const p of overdue) {
    const message = `Part ${p.partNumber} (${p.description}) for ${p.upgradeTitle} was expected ${p.expectedArrival} and has not been received.`;
    if (
      await addNotice(
        t,
        build.id,
        'part_overdue',
        message,
        { partId: p.id, expectedArrival: p.expectedArrival },
        `overdue:${p.id}:${p.expectedArrival}`,
      )
    )
      added++;
  }
  if (added > 0) await queueDigest(t, build, now, atRisk, overdue);
  return added;
}

async function queueDigest(
  t: Transaction,
  build: BuildRef,
  day: string,
  atRisk: EpisodeSlip[],
  overdue: Awaited<ReturnType<typeof overdueParts>>,
) {
  const producers = await sequelize.query<{ id: number; email: string }>(
    "SELECT id, email FROM users WHERE active AND roles && ARRAY['producer','owner']::text[] ORDER BY id",
    { type: QueryTypes.SELECT, transaction: t },
  );
  const mail = slipDigestMail({
    buildName: build.name,
    day,
    slips: atRisk,
    overdue,
    plannerUrl: `${config().publicUrl}/builds/${build.id}/planner`,
  });
  for (const u of producers) {
    await enqueueMail(t, {
      kind: 'slip_digest',
      to: u.email,
      subject: mail.subject,
      text: mail.text,
      dedupeKey: `slip-digest:${build.id}:${day}:${u.id}`,
    });
  }
}

/** A notice for the part's own move, beside the episodes it puts at risk. */
export async function noticePartMovedLater(
  t: Transaction,
  build: BuildRef,
  part: { id: number; partNumber: string; description: string },
  from: string | null,
  to: string,
) {
  const days = from ? daysBetween(from, to) : null;
  const message = from
    ? `Part ${part.partNumber} (${part.description}) now expected ${to}, ${days} day${days === 1 ? '' : 's'} later than ${from}.`
    : `Part ${part.partNumber} (${part.description}) now expected ${to}.`;
  await addNotice(t, build.id, 'part_later', message, { partId: part.id, from, to, days }, `later:${part.id}:${to}`);
}

/** The newest notices and how many this person has not seen. */
export async function listNotices(userId: number, buildId: number, limit = 50) {
  const [notices, [seen]] = await Promise.all([
    sequelize.query<Omit<Notice, 'unread' | 'createdAt'> & { createdAt: string | Date }>(
      `SELECT id, kind, message, data, created_at AS "createdAt" FROM notices WHERE build_id = :buildId ORDER BY id DESC LIMIT :limit`,
      { replacements: { buildId, limit }, type: QueryTypes.SELECT },
    ),
    sequelize.query<{ last_seen_id: number }>(
      'SELECT last_seen_id FROM notice_reads WHERE user_id = :userId AND build_id = :buildId',
      { replacements: { userId, buildId }, type: QueryTypes.SELECT },
    ),
  ]);
  const lastSeen = seen?.last_seen_id ?? 0;
  const [{ unread }] = await sequelize.query<{ unread: number }>(
    'SELECT count(*)::int AS unread FROM notices WHERE build_id = :buildId AND id > :lastSeen',
    { replacements: { buildId, lastSeen }, type: QueryTypes.SELECT },
  );
  return {
    notices: notices.map((n) => ({ ...n, createdAt: new Date(n.createdAt).toISOString(), unread: n.id > lastSeen })),
    unread,
  };
}

/** Marks every notice up to the newest as seen by this person. */
export async function markNoticesSeen(userId: number, buildId: number) {
  await sequelize.query(
    `INSERT INTO notice_reads (user_id, build_id, last_seen_id)
     SELECT :userId, :buildId, coalesce(max(id), 0) FROM notices WHERE build_id = :buildId
     ON CONFLICT (user_id, build_id) DO UPDATE SET last_seen_id = GREATEST(notice_reads.last_seen_id, EXCLUDED.last_seen_id)`,
    { replacements: { userId, buildId } },
  );
  return listNotices(userId, buildId);
}

/** What the planner and overview show: every episode's baseline against plan and projection. */
export async function slipReport(build: BuildRef) {
  const now = today(build.timeZone);
  await sequelize.transaction((t) => refreshSlipNotices(t, build, now));
  const slips = await loadSlips(build.id, undefined, now);
  return { today: now, episodes: slips, atRisk: slips.filter((s) => s.releaseAtRisk).map((s) => s.episodeId) };
}
