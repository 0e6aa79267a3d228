// Marketing's triage of viewer requests: accept into the backlog (link or create an upgrade),
// merge duplicates (votes move, each person still counted once), decline with a reason.
import { QueryTypes, type Transaction } from 'sequelize';
import { sequelize, Upgrade, ViewerRequest } from '../models';
import { AppError, badRequest, notFound } from '../errors';
import { record, type Actor } from './activity';
import type { TriageInput } from '../../shared/schemas/viewerRequest';
import type { RequestState } from '../../shared/domain';

export interface StaffRequestRow {
  id: number;
  title: string;
  details: string | null;
  state: RequestState;
  votes: number;
  pendingVotes: number;
  confirmed: boolean;
  upgradeId: number | null;
  upgradeTitle: string | null;
  mergedIntoId: number | null;
  mergedIntoTitle: string | null;
  declineReason: string | null;
  createdAt: string;
  version: number;
}

async function rows(
  buildId: number,
  where: string,
  replacements: Record<string, unknown>,
  t?: Transaction,
): Promise<StaffRequestRow[]> {
  const list = await sequelize.query<Record<string, unknown>>(
    `SELECT r.id, r.title, r.details, r.state, r.upgrade_id, r.version, r.merged_into_id, r.decline_reason, r.created_at,
            r.confirmed_at IS NOT NULL AS confirmed, u.title AS upgrade_title, m.title AS merged_into_title,
            (SELECT count(*)::int FROM viewer_votes v WHERE v.request_id = r.id AND v.confirmed_at IS NOT NULL) AS votes,
            (SELECT count(*)::int FROM viewer_votes v WHERE v.request_id = r.id AND v.confirmed_at IS NULL AND v.expires_at > now()) AS pending
     FROM viewer_requests r
     LEFT JOIN upgrades u ON u.id = r.upgrade_id
     LEFT JOIN viewer_requests m ON m.id = r.merged_into_id
     WHERE r.build_id = :buildId ${where}
     ORDER BY (r.state = 'new') DESC, votes DESC, r.created_at DESC`,
    { replacements: { buildId, ...replacements }, type: QueryTypes.SELECT, transaction: t },
  );
  return list.map((r) => ({
    id: r.id as number,
    title: r.title as string,
    details: r.details as string | null,
    state: r.state as RequestState,
    votes: r.votes as number,
    pendingVotes: r.pending as number,
    confirmed: r.confirmed as boolean,
    upgradeId: r.upgrade_id as number | null,
    upgradeTitle: r.upgrade_title as string | null,
    mergedIntoId: r.merged_into_id as number | null,
    mergedIntoTitle: r.merged_into_title as string | null,
    declineReason: r.decline_reason as string | null,
    createdAt: new Date(r.created_at as string).toISOString(),
    version: r.version as number,
  }));
}

/** Requests of a build; unconfirmed ones (nobody opened the link yet) are left out. */
export function listRequests(buildId: number, state?: RequestState) {
  return rows(buildId, `AND r.confirmed_at IS NOT NULL ${state ? 'AND r.state = :state' : ''}`, {
    state: state ?? null,
  });
}

async function one(buildId: number, id: number, t: Transaction) {
  return (await rows(buildId, 'AND r.id = :id', { id }, t))[0]!;
}

export async function triage(
  actor: Actor,
  buildId: number,
  requestId: number,
  input: TriageInput,
): Promise<StaffRequestRow> {
  return sequelize.transaction(async (t) => {
    const req = await ViewerRequest.findOne({ where: { id: requestId, buildId }, transaction: t, lock: t.LOCK.UPDATE });
    if (!req || !req.confirmedAt) throw notFound('Request');
    if (req.version !== input.version) {
      // Someone triaged it first (two accepts at once would otherwise create two upgrades).
      throw new AppError(
        409,
        'stale',
        `"${req.title}" was changed since you loaded it; it is now ${req.state}. Nothing was written; reload and look again.`,
        undefined,
        { current: await one(buildId, req.id, t) },
      );
    }
    if (req.state === 'merged')
      throw new AppError(409, 'bad_state', `"${req.title}" was merged into another request; triage that one instead.`);
    const before = req.toJSON() as unknown as Record<string, unknown>;
    let summary = '';

    if (input.action === 'accept') {
      let upgrade: Upgrade | null;
      if (input.upgradeId) {
        upgrade = await Upgrade.findOne({ where: { id: input.upgradeId, buildId }, transaction: t });
        if (!upgrade)
          throw badRequest('That upgrade is not in this build.', [
            { path: 'upgradeId', message: 'is not an upgrade of this build' },
          ]);
      } else {
        const n = input.newUpgrade!;
        upgrade = await Upgrade.create(
          {
            buildId,
            title: n.title,
            area: n.area,
            estimatedHours: n.estimatedHours ?? 0,
            replaces: null,
            becomes: null,
            installedOn: null,
            episodeId: null,
            episodePosition: null,
            notes: `Asked for by viewers: "${req.title}"`.slice(0, 4000),
            tireFrom: null,
            tireTo: null,
          },
          { transaction: t },
        );
        await record(t, {
          actor,
          buildId,
          entity: 'upgrade',
          entityId: upgrade.id,
          action: 'create',
          summary: `Added ${upgrade.title} from a viewer request`,
          after: { title: upgrade.title, area: upgrade.area },
        });
      }
      req.state = 'accepted';
      req.upgradeId = upgrade.id;
      req.declineReason = null;
      summary = `Accepted viewer request "${req.title}" as upgrade ${upgrade.title}`;
    } else if (input.action === 'merge') {
      if (input.intoId === req.id)
        throw badRequest('A request cannot be merged into itself.', [{ path: 'intoId', message: 'is this request' }]);
      const target = await ViewerRequest.findOne({
        where: { id: input.intoId!, buildId },
        transaction: t,
        lock: t.LOCK.UPDATE,
      });
      if (!target || !target.confirmedAt)
        throw badRequest('That request is not in this build.', [
          { path: 'intoId', message: 'is not a request of this build' },
        ]);
      if (target.state === 'merged')
        throw badRequest(`"${target.title}" was itself merged; merge into the request it went into.`, [
          { path: 'intoId', message: 'was merged into another request' },
        ]);
      // People who already voted for the target keep one vote there; the rest move over.
      await sequelize.query(
        `DELETE FROM viewer_votes d WHERE d.request_id = :from AND EXISTS (
           SELECT 1 FROM viewer_votes k WHERE k.request_id = :into AND k.email_hash = d.email_hash AND k.confirmed_at IS NOT NULL)`,
        { replacements: { from: req.id, into: target.id }, transaction: t },
      );
      await sequelize.query('UPDATE viewer_votes SET request_id = :into WHERE request_id = :from', {
        replacements: { from: req.id, into: target.id },
        transaction: t,
      });
      await sequelize.query(
        `UPDATE viewer_requests SET merged_into_id = :into, updated_at = now() WHERE merged_into_id = :from AND build_id = :buildId`,
        {
          replacements: { from: req.id, into: target.id, buildId },
          transaction: t,
        },
      );
      req.state = 'merged';
      req.mergedIntoId = target.id;
      summary = `Merged viewer request "${req.title}" into "${target.title}"`;
    } else {
      req.state = 'declined';
      req.declineReason = input.reason!;
      req.upgradeId = null;
      summary = `Declined viewer request "${req.title}": ${input.reason}`;
    }
    await req.save({ transaction: t });
    await record(t, {
      actor,
      buildId,
      entity: 'viewer_request',
      entityId: req.id,
      action: input.action,
      summary: summary.slice(0, 1000),
      before,
      after: req.toJSON() as unknown as Record<string, unknown>,
    });
    return one(buildId, req.id, t);
  });
}
