// The shop floor of one build: work in the bay now and the episode being worked, as a checklist;
// stepping back a mark and recording a read safety caution.
import { api, qs } from './http';
import type { ShopFloorSeen } from '@shared/contracts/shopFloor';
import type { UpgradeAnswer } from '@shared/contracts/upgrade';
import type { InstallerChange } from './upgrades';

export type { Hours, ShopFloorItem } from '@shared/contracts/shopFloor';
/** The shop floor as a screen holds it (money fields only when the person may see them). */
export type ShopFloor = ShopFloorSeen;

export type Mark = 'installState' | 'installSegment' | 'demoSegment';

/** One mark a card offers: the words on the button and the change it sends. */
export interface CardAction {
  label: string;
  /** What a screen reader hears ("Start Heated steering wheel"). */
  named: string;
  change: InstallerChange;
  mark: Mark;
  /** The words of the undo bar once it is done. */
  done: string;
}

export const shopFloorApi = {
  get: (buildId: number, episodeId?: number) =>
    api.get<ShopFloor>(`/api/builds/${buildId}/shop-floor${qs({ episodeId })}`),
  stepBack: (buildId: number, upgradeId: number, body: { mark: Mark; version: number; reason?: string }) =>
    api.post<UpgradeAnswer>(`/api/builds/${buildId}/shop-floor/upgrades/${upgradeId}/step-back`, body),
  cautionRead: (buildId: number, upgradeId: number) =>
    api.post<void>(`/api/builds/${buildId}/shop-floor/upgrades/${upgradeId}/caution-read`, {}),
};
