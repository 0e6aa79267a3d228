// A slip in the "Project Tern" demo: the wireless charging pad came 8 days later than first promised,
// so "Ready to tow" was moved back a week after it was scheduled. Its baseline keeps the first dates,
// the history keeps the part's date changes, and the planner shows the notices. Demo mode only.
import { QueryTypes } from 'sequelize';
import type { MigrationContext } from '../migrate';
import { Build, Episode, Part, User } from '../../models';
import { record } from '../../services/activity';
import { TERN_BUILD } from './data/project-tern';
import { addDays } from '../../../shared/planner/dates';

const EPISODE = 'Ready to tow';
const PART = 'HT-WCP-9510';
const WEEK = 7;

export async function up({ context: { sequelize } }: { context: MigrationContext }) {
  const build = await Build.findOne({ where: { slug: TERN_BUILD.slug } });
  if (!build) return;
  const [episode, part, producer] = await Promise.all([
    Episode.findOne({ where: { buildId: build.id, title: EPISODE } }),
    Part.findOne({ where: { buildId: build.id, partNumber: PART } }),
    User.findOne({ where: { email: 'producer@cedar-ridge.test' } }),
  ]);
  if (!episode?.shootDate || !episode.releaseDate || !part?.expectedArrival || episode.state !== 'scheduled') return;
  const actor = producer ? { id: producer.id, name: producer.name } : null;
  // The part keeps its seeded date (other demo screens show it); the first promise was 8 days earlier.
  const nowDue = part.expectedArrival;
  const firstDue = addDays(nowDue, -WEEK - 1);
  const baselineShoot = addDays(episode.shootDate, -WEEK);
  const baselineRelease = addDays(episode.releaseDate, -WEEK);

  await sequelize.transaction(async (transaction) => {
    await sequelize.query(
      'UPDATE episodes SET baseline_shoot_date = :baselineShoot, baseline_release_date = :baselineRelease WHERE id = :id',
      { replacements: { id: episode.id, baselineShoot, baselineRelease }, transaction, type: QueryTypes.UPDATE },
    );
    await record(transaction, {
      actor,
      buildId: build.id,
      entity: 'part',
      entityId: part.id,
      action: 'update',
      summary: `Expected arrival moved from ${firstDue} to ${nowDue} (${WEEK + 1} days later) for part ${PART}`,
      changes: { expectedArrival: [firstDue, nowDue] },
    });
    await record(transaction, {
      actor,
      buildId: build.id,
      entity: 'episode',
      entityId: episode.id,
      action: 'update',
      summary: `Moved episode "${EPISODE}" back a week to wait for the wireless charging pad`,
      changes: { shootDate: [baselineShoot, episode.shootDate], releaseDate: [baselineRelease, episode.releaseDate] },
    });
    const notices = [
      {
        kind: 'part_later',
        key: `later:${part.id}:${nowDue}`,
        message: `Part ${PART} (${part.description}) now expected ${nowDue}, ${WEEK + 1} days later than ${firstDue}.`,
        data: { partId: part.id, from: firstDue, to: nowDue, days: WEEK + 1 },
      },
      {
        kind: 'release_at_risk',
        key: `risk:${episode.id}:${nowDue}`,
        message: `Episode ${episode.number}, "${EPISODE}": release ${baselineRelease} at risk by ${WEEK} days (shoot ${baselineShoot} → ${episode.shootDate}). ${PART} (${part.description}) for Wireless charging pad is now due ${nowDue}.`,
        data: { episodeId: episode.id, days: WEEK, projectedReleaseDate: episode.releaseDate, partId: part.id },
      },
    ];
    for (const n of notices) {
      await sequelize.query(
        `INSERT INTO notices (build_id, kind, message, data, dedupe_key) VALUES (:buildId, :kind, :message, :data::jsonb, :key) ON CONFLICT DO NOTHING`,
        {
          replacements: {
            buildId: build.id,
            kind: n.kind,
            message: n.message,
            data: JSON.stringify(n.data),
            key: n.key,
          },
          transaction,
        },
      );
    }
  });
}

export async function down() {}
