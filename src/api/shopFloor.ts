// The shop floor of one build: work in the bay now and the episode being worked, as a checklist;
// stepping back a mark and recording a read safety caution.
import { api, qs } from './http';
import type { EpisodeRecord, EpisodeState, UpgradeRecord } from '@shared/domain';
import type { FlagCaution } from '@shared/safety';
import type { PartRow } from './parts';
import type { InstallerChange } from './upgrades';

export interface Hours {
  mine: number;
  everyone: number;
}

export interface ShopFloorItem {
  upgrade: UpgradeRecord;
  parts: PartRow[];
  prerequisitesMet: boolean;
  blockedBy: string[];
  cautions: FlagCaution[];
  /** This person has read (and acknowledged) the safety caution. */
  cautionRead: boolean;
  hours: Hours;
  /** For in-bay work of another episode: which one. */
  episode?: { id: number; number: number; title: string; state: EpisodeState } | null;
}

export interface ShopFloor {
  episode: EpisodeRecord | null;
  inBay: ShopFloorItem[];
  upgrades: ShopFloorItem[];
  choices: { id: number; number: number; title: string; state: EpisodeState; shootDate: string | null }[];
  today: Hours & { date: string };
}

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
  get: (buildId: number, episodeId?: number) => api.get<ShopFloor>(`/api/builds/${buildId}/shop-floor${qs({ episodeId })}`),
  stepBack: (buildId: number, upgradeId: number, body: { mark: Mark; version: number; reason?: string }) =>
    api.post<{ upgrade: UpgradeRecord }>(`/api/builds/${buildId}/shop-floor/upgrades/${upgradeId}/step-back`, body),
  cautionRead: (buildId: number, upgradeId: number) => api.post<void>(`/api/builds/${buildId}/shop-floor/upgrades/${upgradeId}/caution-read`, {}),
};
