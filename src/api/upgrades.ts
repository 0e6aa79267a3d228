// Upgrades of one build: the paged, filtered backlog, one upgrade with its lines, changes,
// prerequisites, activity history and the backlog's CSV export and import.
import { api, qs, request, type ChangeOptions } from './http';
import type { Area, InstallState, SafetyFlag, SegmentState } from '@shared/domain';
import type {
  ActivityRow,
  UpgradeAnswer,
  UpgradeDetail,
  UpgradePage,
  UpgradeSeen as UpgradeRecord,
} from '@shared/contracts/upgrade';
import type { ImportReport } from '@shared/contracts/part';

export type UpgradeSort = 'title' | 'area' | 'priority' | 'estimatedHours' | 'installState' | 'episode';

export interface UpgradeQuery {
  area?: Area | null;
  installState?: InstallState | null;
  /** An episode id, or 'none' for upgrades not yet in an episode. */
  episodeId?: number | 'none' | null;
  safetyFlag?: SafetyFlag | null;
  q?: string | null;
  sort?: UpgradeSort | null;
  dir?: 'asc' | 'desc' | null;
  page?: number;
  pageSize?: number;
}

// The answers' types come from their contracts (shared/contracts/upgrade.ts).
export type { UpgradePage, UpgradeDetail, ActivityRow } from '@shared/contracts/upgrade';

/** Fields producers and owners edit (money fields are sent only by those who see money). */
export type UpgradeInput = Partial<
  Omit<UpgradeRecord, 'id' | 'buildId' | 'version' | 'prerequisiteIds' | 'episodePosition'>
>;

/** The fields an installer may change. */
export type InstallerChange = {
  installState?: InstallState;
  installSegment?: SegmentState;
  demoSegment?: SegmentState;
  confirmPartsNotReceived?: boolean;
};

/** The answer of a CSV import, dry run or not. */
export type { ImportReport } from '@shared/contracts/part';

const base = (buildId: number) => `/api/builds/${buildId}/upgrades`;

export const upgradesApi = {
  list: (buildId: number, q: UpgradeQuery = {}) => api.get<UpgradePage>(base(buildId) + qs({ ...q })),
  get: (buildId: number, id: number) => api.get<UpgradeDetail>(`${base(buildId)}/${id}`),
  create: (buildId: number, body: UpgradeInput) => api.post<UpgradeAnswer>(base(buildId), body),
  update: (
    buildId: number,
    id: number,
    body: (UpgradeInput | InstallerChange) & { version: number },
    opts: ChangeOptions = {},
  ) => api.patch<UpgradeAnswer>(`${base(buildId)}/${id}`, body, opts),
  remove: (buildId: number, id: number) => api.del<void>(`${base(buildId)}/${id}`),
  setPrerequisites: (buildId: number, id: number, prerequisiteIds: number[]) =>
    api.put<UpgradeAnswer>(`${base(buildId)}/${id}/prerequisites`, { prerequisiteIds }),
  activity: (buildId: number, id: number) => api.get<{ activity: ActivityRow[] }>(`${base(buildId)}/${id}/activity`),
  exportCsv: (buildId: number) => request<string>('GET', `${base(buildId)}.csv`, undefined, { raw: true }),
  importCsv: (buildId: number, csv: string, dryRun: boolean) =>
    request<ImportReport>('POST', `${base(buildId)}/import${dryRun ? '?dryRun=1' : ''}`, csv, {
      contentType: 'text/csv',
    }),
};

/** Every upgrade of a build (the backlog pages through; pickers need them all). */
export async function allUpgrades(buildId: number): Promise<UpgradeRecord[]> {
  const out: UpgradeRecord[] = [];
  for (let page = 1; page < 50; page++) {
    const r = await upgradesApi.list(buildId, { page, pageSize: 500, sort: 'title', dir: 'asc' });
    out.push(...r.upgrades);
    if (out.length >= r.total || r.upgrades.length === 0) break;
  }
  return out;
}
