// The shop floor of one build: the episode being worked, as a checklist.
import { api, qs } from './http';
import type { EpisodeRecord, EpisodeState, UpgradeRecord } from '@shared/domain';
import type { FlagCaution } from '@shared/safety';
import type { PartRow } from './parts';

export interface ShopFloorItem {
  upgrade: UpgradeRecord;
  parts: PartRow[];
  prerequisitesMet: boolean;
  blockedBy: string[];
  cautions: FlagCaution[];
}

export interface ShopFloor {
  episode: EpisodeRecord | null;
  upgrades: ShopFloorItem[];
  choices: { id: number; number: number; title: string; state: EpisodeState; shootDate: string | null }[];
}

export const shopFloorApi = {
  get: (buildId: number, episodeId?: number) => api.get<ShopFloor>(`/api/builds/${buildId}/shop-floor${qs({ episodeId })}`),
};
