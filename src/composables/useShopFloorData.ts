// The shop floor's data, online or not: the server's answer (kept on the phone after every load),
// or without the network the copy the phone kept, shown with the person's waiting changes applied.
import { computed, ref, type Ref } from 'vue';
import { ApiError } from '@/api/http';
import { shopFloorApi, type ShopFloor } from '@/api/shopFloor';
import { offlineStore } from '@/offline/store';
import { withWaiting } from '@/offline/apply';
import type { UseOutbox } from './useOutbox';
import type { UpgradeRecord } from '@shared/domain';

export function useShopFloorData(
  buildId: Ref<number>,
  episodeChoice: Ref<number | null>,
  userId: number,
  outbox: UseOutbox,
) {
  const base = ref<ShopFloor | null>(null);
  /** When the screen shows the phone's copy: when that copy was saved. Null while online answers arrive. */
  const copySavedAt = ref<string | null>(null);

  const data = computed(() =>
    base.value
      ? withWaiting(
          base.value,
          outbox.waiting.value.filter((a) => a.buildId === buildId.value),
        )
      : null,
  );

  let answeredAt: string | null = null;

  async function fetch(): Promise<void> {
    try {
      const answer = await shopFloorApi.get(buildId.value, episodeChoice.value ?? undefined);
      base.value = answer;
      answeredAt = new Date().toISOString();
      copySavedAt.value = null;
      offlineStore.saveSnapshot(userId, buildId.value, answer).catch(() => undefined);
    } catch (e) {
      if (!(e instanceof ApiError && e.status === 0)) throw e;
      // No network: keep what is on screen, else open the copy this phone kept.
      if (base.value) {
        copySavedAt.value ??= answeredAt ?? new Date().toISOString();
        return;
      }
      const copy = await offlineStore.snapshot(userId, buildId.value).catch(() => undefined);
      if (!copy)
        throw new ApiError(
          0,
          'offline',
          'You are offline, and this phone has no copy of this shop floor yet. Open it once with the network to keep one.',
        );
      base.value = copy.data;
      copySavedAt.value = copy.savedAt;
    }
  }

  /** Everywhere the upgrade appears, the server's newer record (the answer to a sent mark). */
  function patchUpgrade(upgrade: UpgradeRecord) {
    if (!base.value) return;
    for (const item of [...base.value.inBay, ...base.value.upgrades])
      if (item.upgrade.id === upgrade.id && item.upgrade.version < upgrade.version)
        item.upgrade = { ...item.upgrade, ...upgrade };
  }
  function markCautionRead(upgradeId: number) {
    for (const item of [...(base.value?.inBay ?? []), ...(base.value?.upgrades ?? [])])
      if (item.upgrade.id === upgradeId) item.cautionRead = true;
  }

  return { data, copySavedAt, fetch, patchUpgrade, markCautionRead };
}
