// The one rule for taking an episode live, whichever route asks (PATCH of the episode's state or
// the publishing route): who may, and that every upgrade in it is done unless someone with the
// right publishes anyway and gives a reason, which the history keeps.
import type { Transaction } from 'sequelize';
import { Upgrade, type Episode } from '../models';
import { AppError, badRequest, forbidden } from '../errors';
import { record, type Actor } from './activity';
import { notifyEpisodeLive } from './notifications';
import { describeUnfinished, unfinishedOf, type UnfinishedUpgrade } from '../../shared/episodeReadiness';

/** The roles that may take an episode live. */
export const PUBLISHER_ROLES = ['owner', 'producer', 'marketing'] as const;

export interface LiveActor extends Actor {
  roles: readonly string[];
}

export const mayPublish = (a: LiveActor) => a.roles.some((r) => (PUBLISHER_ROLES as readonly string[]).includes(r));

export async function unfinishedUpgrades(
  buildId: number,
  episodeId: number,
  t?: Transaction,
): Promise<UnfinishedUpgrade[]> {
  const rows = await Upgrade.findAll({
    where: { buildId, episodeId },
    attributes: ['id', 'title', 'installState', 'installSegment', 'demoSegment'],
    order: [
      ['episodePosition', 'ASC'],
      ['id', 'ASC'],
    ],
    transaction: t,
  });
  return unfinishedOf(rows);
}

export async function readiness(buildId: number, episodeId: number) {
  const unfinished = await unfinishedUpgrades(buildId, episodeId);
  return { ready: unfinished.length === 0, unfinished };
}

/**
 * Checks, inside the caller's transaction and before anything is written, that `actor` may take
 * `ep` live now. Refuses with 403 (role) or 409 naming each unfinished upgrade; with a reason,
 * records the override and lets it through.
 */
export async function assertMayGoLive(t: Transaction, actor: LiveActor, ep: Episode, overrideReason?: string | null) {
  if (!mayPublish(actor)) throw forbidden('Only marketing, a producer or the owner may take an episode live.');
  const unfinished = await unfinishedUpgrades(ep.buildId, ep.id, t);
  if (!unfinished.length) return;
  const reason = overrideReason?.trim();
  if (!reason) {
    throw new AppError(
      409,
      'episode_unfinished',
      `Episode ${ep.number} is not finished. ${describeUnfinished(unfinished)}. Finish these first, or publish anyway with a reason.`,
      undefined,
      { unfinished },
    );
  }
  if (reason.length > 1000)
    throw badRequest('Reason: keep it to 1000 characters.', [
      { path: 'overrideReason', message: 'Reason: keep it to 1000 characters' },
    ]);
  await record(t, {
    actor,
    buildId: ep.buildId,
    entity: 'episode',
    entityId: ep.id,
    action: 'publish_anyway',
    summary:
      `Published episode ${ep.number} anyway, unfinished (${unfinished.map((u) => u.title).join(', ')}). Reason: ${reason}`.slice(
        0,
        1000,
      ),
    changes: {},
  });
}

/** After the episode is saved live: the "it is live" mails, queued in the same transaction. */
export async function afterGoLive(t: Transaction, ep: Episode) {
  await notifyEpisodeLive(t, ep.buildId, ep.id);
}
