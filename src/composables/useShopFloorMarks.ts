// A mark from a card's big button: sent to the server with a key (so a resend after a lost answer is
// not a second mark), or kept in the outbox when the network is away; the parts question first when
// "installed" is marked with parts not in hand; the ten-second undo offered afterwards.
import { ref, type ComputedRef, type Ref } from 'vue';
import { useMessage } from 'naive-ui';
import type { CardAction, ShopFloorItem } from '@/api/shopFloor';
import { upgradesApi } from '@/api/upgrades';
import { ApiError } from '@/api/http';
import { newActionKey } from '@/offline/store';
import { PART_STATE_LABELS, type PartState } from '@shared/domain';
import { errorMessage } from './errorMessage';
import { useConfirm } from './useConfirm';
import type { useShopFloorQueue } from './useShopFloorQueue';
import type { LastMark } from './useShopFloorStepBack';

/** After a mark the buttons ignore taps this long, so a double tap never reaches the next action. */
const SETTLE_MS = 900;
const settle = () => new Promise((r) => setTimeout(r, SETTLE_MS));

type MissingPart = { description: string; state: PartState; expectedArrival: string | null };

const notInHand = (item: ShopFloorItem) =>
  item.parts.filter((p) => p.state !== 'received' && p.state !== 'fitted' && p.state !== 'returned');

export function useShopFloorMarks(opts: {
  buildId: Ref<number>;
  queueing: ComputedRef<boolean>;
  queue: ReturnType<typeof useShopFloorQueue>;
  undo: Ref<LastMark | null>;
  load: () => Promise<void>;
}) {
  const { buildId, queueing, queue, undo, load } = opts;
  const message = useMessage();
  const confirm = useConfirm();
  /** The upgrade whose mark is being sent; the buttons wait meanwhile. */
  const busy = ref<number | null>(null);

  function askPartsAnyway(item: ShopFloorItem, action: CardAction, parts: MissingPart[]) {
    confirm({
      title: 'Parts not received',
      content: `Not received yet: ${parts.map((p) => `${p.description} (${PART_STATE_LABELS[p.state]}${p.expectedArrival ? `, due ${p.expectedArrival}` : ''})`).join('; ')}. Mark ${item.upgrade.title} installed anyway? The parts are named in its history.`,
      positiveText: 'Mark installed anyway',
      onPositiveClick: () => void act(item, action, true),
    });
  }

  /** Keeps a mark in the outbox, made from the version on screen; the same parts question as online first. */
  async function queueMark(item: ShopFloorItem, action: CardAction, confirmed: boolean, key?: string) {
    if (action.change.installState === 'installed' && !confirmed && notInHand(item).length) {
      busy.value = null;
      askPartsAnyway(item, action, notInHand(item));
      return;
    }
    const seq = await queue.queueMark(
      item,
      action,
      { ...action.change, ...(confirmed ? { confirmPartsNotReceived: true } : {}) },
      key,
    );
    undo.value = {
      text: `${action.done} Waiting to send.`,
      upgradeId: item.upgrade.id,
      mark: action.mark,
      version: item.upgrade.version + 1,
      stamp: Date.now(),
      seq,
    };
    await settle();
  }

  async function act(item: ShopFloorItem, action: CardAction, confirmed = false) {
    if (busy.value !== null) return;
    busy.value = item.upgrade.id;
    // Sent with a key: if the answer is lost on the way, the queued resend carries the same key.
    const key = newActionKey();
    try {
      if (queueing.value) return await queueMark(item, action, confirmed);
      const body = {
        ...action.change,
        version: item.upgrade.version,
        ...(confirmed ? { confirmPartsNotReceived: true } : {}),
      };
      const { upgrade } = await upgradesApi.update(buildId.value, item.upgrade.id, body, { idempotencyKey: key });
      undo.value = {
        text: action.done,
        upgradeId: upgrade.id,
        mark: action.mark,
        version: upgrade.version,
        stamp: Date.now(),
      };
      await load();
      await settle();
    } catch (e) {
      // The network went while sending: the mark waits in the outbox instead.
      if (e instanceof ApiError && e.status === 0) return await queueMark(item, action, confirmed, key);
      if (e instanceof ApiError && e.code === 'parts_not_received') {
        busy.value = null;
        askPartsAnyway(item, action, (e.body.parts as MissingPart[] | undefined) ?? []);
        return;
      }
      if (e instanceof ApiError && e.code === 'stale')
        message.warning('Someone else changed this upgrade; here is the latest.');
      else message.error(errorMessage(e, 'Could not save.'));
      await load();
    } finally {
      if (busy.value === item.upgrade.id) busy.value = null;
    }
  }

  return { busy, act };
}
