// Confirmed viewer votes per upgrade, which the planner counts as priority: votes of accepted
// requests linked to the upgrade, each person counted once per upgrade.
import { QueryTypes } from 'sequelize';
import { sequelize } from '../models';

export async function votesByUpgrade(buildId: number): Promise<Record<number, number>> {
  const rows = await sequelize.query<{ upgrade_id: number; votes: number }>(
    `SELECT r.upgrade_id, count(DISTINCT v.email_hash)::int AS votes
     FROM viewer_requests r JOIN viewer_votes v ON v.request_id = r.id
     WHERE r.build_id = :buildId AND r.state = 'accepted' AND r.upgrade_id IS NOT NULL AND v.confirmed_at IS NOT NULL
     GROUP BY r.upgrade_id`,
    { replacements: { buildId }, type: QueryTypes.SELECT },
  );
  return Object.fromEntries(rows.map((r) => [r.upgrade_id, r.votes]));
}
