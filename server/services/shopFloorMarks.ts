// Shop-floor writes beside the plain state change: stepping back a mark (only by the person who made
// it; after a few minutes only with a reason) and recording that a person read an upgrade's safety caution.
import { Op, type Transaction } from 'sequelize';
import { sequelize, Activity, type Build } from '../models';
import { AppError, badRequest, forbidden } from '../errors';
import { record } from './activity';
import { findUpgrade, stale, upgradeRecord, type Person } from './backlogRecords';
import { cautionsFor } from '../../shared/safety';
import { INSTALL_STATE_LABELS } from '../../shared/domain';
import type { StepBackInput } from '../../shared/schemas/shopFloor';
import { Upgrade as UpgradeContract, type UpgradeForMoney } from '../../shared/contracts/upgrade';

/** A mark older than this needs a reason to step back (common practice: a short grace window). */
export const STEP_BACK_FREE_MS = 10 * 60 * 1000;

const MARK_WORDS = {
  installState: 'install state',
  installSegment: 'install segment',
  demoSegment: 'demo segment',
} as const;
const valueWords = (v: unknown) =>
  v === 'shot'
    ? 'Shot'
    : v === 'not_shot'
      ? 'Not shot'
      : (INSTALL_STATE_LABELS[v as keyof typeof INSTALL_STATE_LABELS] ?? String(v));

/** The newest history row that changed this mark of the upgrade. */
async function lastMark(buildId: number, upgradeId: number, mark: StepBackInput['mark'], t: Transaction) {
  return Activity.findOne({
    where: {
      buildId,
      entity: 'upgrade',
      entityId: upgradeId,
      action: { [Op.in]: ['update', 'step_back'] },
      [Op.and]: [sequelize.literal(`("Activity"."changes" -> '${mark}') IS NOT NULL`)],
    },
    order: [['id', 'DESC']],
    transaction: t,
  });
}

export async function stepBack(
  actor: Person,
  build: Build,
  id: number,
  input: StepBackInput,
  now = Date.now(),
): Promise<UpgradeForMoney> {
  return sequelize.transaction(async (t) => {
    const u = await findUpgrade(build.id, id, t, true);
    if (u.version !== input.version) throw stale(await upgradeRecord(u, t), actor, UpgradeContract);
    const { mark } = input;
    const last = await lastMark(build.id, u.id, mark, t);
    const [was, is] = (last?.changes[mark] ?? [null, null]) as [unknown, unknown];
    if (!last || last.action === 'step_back' || is !== u[mark] || was === null) {
      throw new AppError(
        409,
        'nothing_to_step_back',
        `There is no ${MARK_WORDS[mark]} mark on ${u.title} to step back.`,
      );
    }
    if (last.userId !== actor.id) {
      throw forbidden(`Only ${last.userName ?? 'the person who made it'} can step back this mark.`);
    }
    if (now - last.createdAt.getTime() > STEP_BACK_FREE_MS && !input.reason) {
      throw badRequest('Check these fields: reason.', [
        { path: 'reason', message: 'say why: this mark is more than ten minutes old' },
      ]);
    }
    if (mark === 'installState' && was === 'queued' && (u.installSegment === 'shot' || u.demoSegment === 'shot')) {
      throw new AppError(409, 'segments_shot', `${u.title} has a segment marked shot: step that back first.`);
    }
    const before = await upgradeRecord(u, t);
    u.set(mark, was as never);
    if (mark === 'installState' && was !== 'installed') u.installedOn = null;
    await u.save({ transaction: t });
    const after = await upgradeRecord(u, t);
    const reason = input.reason ? ` (reason: ${input.reason})` : '';
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'upgrade',
      entityId: u.id,
      action: 'step_back',
      summary: `Stepped back ${u.title}: ${MARK_WORDS[mark]} ${valueWords(is)} → ${valueWords(was)}${reason}`,
      before,
      after,
    });
    return after;
  });
}

/** Records once per person that they read the upgrade's safety caution; later reads change nothing. */
export async function cautionRead(actor: Person, build: Build, id: number) {
  await sequelize.transaction(async (t) => {
    const u = await findUpgrade(build.id, id, t, true);
    const cautions = cautionsFor(u.safetyFlags);
    if (!cautions.length) throw new AppError(409, 'no_caution', `${u.title} has no safety caution.`);
    const seen = await Activity.count({
      where: { buildId: build.id, entity: 'upgrade', entityId: u.id, action: 'caution_read', userId: actor.id },
      transaction: t,
    });
    if (seen) return;
    await record(t, {
      actor,
      buildId: build.id,
      entity: 'upgrade',
      entityId: u.id,
      action: 'caution_read',
      summary: `Read the safety caution of ${u.title}: ${cautions.map((c) => c.label).join(', ')}`,
      changes: {},
    });
  });
}
