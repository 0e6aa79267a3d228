// The shop floor's way back from a mark: the ten-second undo after a mark (taken out of the outbox if
// it has not gone yet, else stepped back on the server), and the step back a card asks for, which the
// server may want a reason for when the mark is older than a few minutes.
import { ref, type Ref } from 'vue';
import { useMessage } from 'naive-ui';
import { shopFloorApi, type Mark, type ShopFloorItem } from '@/api/shopFloor';
import { ApiError } from '@/api/http';
import { errorMessage } from './errorMessage';
import type { UseOutbox } from './useOutbox';
import type { UpgradeRecord } from '@shared/domain';

/** The last mark, for ten seconds; `seq` when it went to the outbox instead of the server. */
export interface LastMark {
  text: string;
  upgradeId: number;
  mark: Mark;
  version: number;
  stamp: number;
  seq?: number;
}

const MARK_WORDS: Record<Mark, string> = {
  installState: 'The install state',
  installSegment: 'The install segment',
  demoSegment: 'The demo segment',
};

export function useShopFloorStepBack(buildId: Ref<number>, outbox: UseOutbox, load: () => Promise<void>) {
  const message = useMessage();
  const undo = ref<LastMark | null>(null);
  const reasonFor = ref<{ item: ShopFloorItem; mark: Mark; what: string } | null>(null);
  const reasonError = ref('');

  async function stepBack(upgradeId: number, mark: Mark, version: number, reason?: string) {
    const { upgrade } = await shopFloorApi.stepBack(buildId.value, upgradeId, {
      mark,
      version,
      ...(reason ? { reason } : {}),
    });
    message.success(`Stepped back on ${upgrade.title}.`);
    await load();
  }
  async function undoLast() {
    const u = undo.value;
    if (!u) return;
    undo.value = null;
    if (u.seq !== undefined) return undoQueued(u.seq, u.upgradeId, u.mark);
    try {
      await stepBack(u.upgradeId, u.mark, u.version);
    } catch (e) {
      message.error(errorMessage(e, 'Could not undo.'));
      await load();
    }
  }
  /** Undo of a mark that went to the outbox: taken out if not sent yet, else stepped back on the server. */
  async function undoQueued(seq: number, upgradeId: number, mark: Mark) {
    const r = await outbox.cancel(seq);
    if (r.removed) return void message.success('Taken back: that change will not be sent.');
    const sent = (r.sentResult as { upgrade?: UpgradeRecord } | undefined)?.upgrade;
    if (!sent) return void message.warning('That change was not accepted by the server; see the list at the top.');
    try {
      await stepBack(upgradeId, mark, sent.version);
    } catch (e) {
      message.error(errorMessage(e, 'Could not undo.'));
      await load();
    }
  }

  async function askStepBack(item: ShopFloorItem, mark: Mark) {
    try {
      await stepBack(item.upgrade.id, mark, item.upgrade.version);
    } catch (e) {
      if (e instanceof ApiError && e.field('reason')) {
        reasonError.value = '';
        reasonFor.value = { item, mark, what: `${MARK_WORDS[mark]} of ${item.upgrade.title}` };
        return;
      }
      message.error(errorMessage(e, 'Could not step back.'));
      await load();
    }
  }
  async function stepBackWithReason(reason: string) {
    const r = reasonFor.value;
    if (!r) return;
    try {
      await stepBack(r.item.upgrade.id, r.mark, r.item.upgrade.version, reason);
      reasonFor.value = null;
    } catch (e) {
      reasonError.value = errorMessage(e, 'Could not step back.');
    }
  }

  return { undo, reasonFor, reasonError, undoLast, askStepBack, stepBackWithReason };
}
