// The rules of an upgrade's install and filming marks, checked inside every state change
// (services/upgrades.ts) so every route obeys them: a segment is shot only on started work, and
// marking installed with parts not received needs the person's confirmation.
import { Op, type Transaction } from 'sequelize';
import { Part, type Upgrade } from '../models';
import { AppError, badRequest } from '../errors';
import { PART_STATE_LABELS, type InstallState, type SegmentState } from '../../shared/domain';

/** Part states that mean the part is not in the shop yet (returned parts are not needed). */
export const NOT_RECEIVED = ['to_order', 'ordered', 'backordered'] as const;

export interface MissingPart {
  description: string;
  partNumber: string | null;
  state: string;
  expectedArrival: string | null;
}

export const partWords = (p: MissingPart) =>
  `${p.description} (${p.partNumber ? `${p.partNumber}, ` : ''}${PART_STATE_LABELS[p.state as keyof typeof PART_STATE_LABELS]})`;

export async function partsNotReceived(u: Pick<Upgrade, 'id' | 'buildId'>, t?: Transaction): Promise<MissingPart[]> {
  const rows = await Part.findAll({
    where: { buildId: u.buildId, upgradeId: u.id, state: { [Op.in]: [...NOT_RECEIVED] } },
    order: [['id', 'ASC']],
    transaction: t,
  });
  return rows.map((p) => ({
    description: p.description,
    partNumber: p.partNumber ?? null,
    state: p.state,
    expectedArrival: p.expectedArrival ?? null,
  }));
}

interface MarkFields {
  installState?: InstallState;
  installSegment?: SegmentState;
  demoSegment?: SegmentState;
}

/**
 * Refuses a change that breaks a mark rule; answers the parts not received that the person
 * confirmed going ahead without (empty when none), for the history.
 */
export async function checkMarks(
  u: Upgrade,
  fields: MarkFields,
  confirmed: boolean | undefined,
  t: Transaction,
): Promise<MissingPart[]> {
  const installing = fields.installState === 'installed' && u.installState !== 'installed';
  if (confirmed !== undefined && !installing) {
    throw badRequest('Check these fields: confirmPartsNotReceived.', [
      { path: 'confirmPartsNotReceived', message: 'goes only with marking the upgrade installed' },
    ]);
  }
  const state = fields.installState ?? u.installState;
  const shooting = (['installSegment', 'demoSegment'] as const).filter((k) => fields[k] === 'shot' && u[k] !== 'shot');
  if (shooting.length && state === 'queued') {
    const what = shooting
      .map((k) => (k === 'installSegment' ? 'the install segment' : 'the demo segment'))
      .join(' and ');
    throw new AppError(409, 'not_started', `${u.title} has not been started: start it before marking ${what} shot.`);
  }
  if (!installing) return [];
  const missing = await partsNotReceived(u, t);
  if (missing.length && confirmed !== true) {
    throw new AppError(
      409,
      'parts_not_received',
      `These parts of ${u.title} are not received yet: ${missing.map(partWords).join('; ')}. Mark installed anyway?`,
      undefined,
      { parts: missing },
    );
  }
  return missing;
}
