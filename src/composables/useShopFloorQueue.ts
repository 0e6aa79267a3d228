// What the shop floor keeps on the phone when it cannot send at once: marks, hours and photos go to
// the outbox (src/offline/) with the upgrade's version they were made from. A mark that was being
// sent when the network went keeps the key it was sent with, so if the server did save it, the
// resend gets that answer back instead of a second mark.
import type { Ref } from 'vue';
import type { CardAction, ShopFloorItem } from '@/api/shopFloor';
import type { InstallerChange } from '@/api/upgrades';
import type { UseOutbox } from './useOutbox';
import type { LabourKind, MediaStage } from '@shared/domain';

const KIND_WORDS: Record<LabourKind, string> = { install: 'install', filming: 'filming', prep: 'prep' };
const hoursText = (h: number) => `${Number(h.toFixed(2))} h`;

export function useShopFloorQueue(buildId: Ref<number>, userId: number, outbox: UseOutbox) {
  const base = (item: ShopFloorItem) => ({
    userId,
    buildId: buildId.value,
    upgradeId: item.upgrade.id,
    upgradeTitle: item.upgrade.title,
    version: item.upgrade.version,
    createdAt: new Date().toISOString(),
  });
  return {
    /** Queues a mark; answers its place in the outbox (for the undo). */
    queueMark(item: ShopFloorItem, action: CardAction, change: InstallerChange, key?: string): Promise<number> {
      return outbox.enqueue({
        ...base(item),
        kind: 'mark',
        label: action.label,
        mark: action.mark,
        change,
        ...(key ? { key } : {}),
      });
    },
    async queueHours(item: ShopFloorItem, e: { hours: number; kind: LabourKind; workedOn: string }) {
      await outbox.enqueue({
        ...base(item),
        kind: 'hours',
        label: `${hoursText(e.hours)} ${KIND_WORDS[e.kind]} on ${e.workedOn}`,
        hours: e.hours,
        labourKind: e.kind,
        workedOn: e.workedOn,
      });
    },
    async queuePhotos(item: ShopFloorItem, files: File[], stage: MediaStage) {
      for (const file of files)
        await outbox.enqueue({
          ...base(item),
          kind: 'photo',
          label: `Photo ${file.name}`,
          blob: file,
          fileName: file.name,
          stage,
          episodeId: item.upgrade.episodeId ?? null,
        });
    },
  };
}
