// Parts of one build: list (by upgrade or state), create, change, delete, CSV export and import.
import { api, qs, request } from './http';
import type { PartState } from '@shared/domain';
import type { ImportReport, PartSeen } from '@shared/contracts/part';
import { todayIn } from '@shared/dates';
import { useBuildStore } from '@/stores/build';
import { queryClient } from '@/queries/client';
import { keys } from '@/queries/keys';

/** A part as the API sends it (shared/contracts/part.ts): cost and retail price when the person may see them. */
export type PartRow = PartSeen;
export type PartInput = Partial<Omit<PartRow, 'id' | 'buildId'>>;

const base = (buildId: number) => `/api/builds/${buildId}/parts`;

export const partsApi = {
  list: (buildId: number, q: { upgradeId?: number; state?: PartState; page?: number; pageSize?: number } = {}) =>
    api.get<{ parts: PartRow[]; total: number }>(base(buildId) + qs({ ...q })),
  create: (buildId: number, body: PartInput) => api.post<{ part: PartRow }>(base(buildId), body),
  update: (buildId: number, id: number, body: PartInput) =>
    api.patch<{ part: PartRow }>(`${base(buildId)}/${id}`, body),
  remove: (buildId: number, id: number) => api.del<void>(`${base(buildId)}/${id}`),
  exportCsv: (buildId: number) => request<string>('GET', `${base(buildId)}.csv`, undefined, { raw: true }),
  importCsv: (buildId: number, csv: string, dryRun: boolean) =>
    request<ImportReport>('POST', `${base(buildId)}/import${dryRun ? '?dryRun=1' : ''}`, csv, {
      contentType: 'text/csv',
    }),
};

/** Every part of a build, paging through the list. */
export async function allParts(buildId: number): Promise<PartRow[]> {
  const out: PartRow[] = [];
  for (let page = 1; page < 50; page++) {
    const r = await partsApi.list(buildId, { page, pageSize: 500 });
    out.push(...r.parts);
    if (out.length >= r.total || r.parts.length === 0) break;
  }
  return out;
}

/** Today as YYYY-MM-DD in the open build's time zone (the shop's clock), as the server counts it. */
export function today(): string {
  let zone: string | undefined;
  try {
    const id = useBuildStore().buildId;
    zone = id ? queryClient.getQueryData<{ timeZone?: string }>(keys.buildRecord(id))?.timeZone : undefined;
  } catch {
    zone = undefined; // no store yet (outside the app): UTC
  }
  return todayIn(zone);
}

/** Marks a part received today: the one part change an installer makes from the bay. */
export const receivePart = (buildId: number, part: PartRow) =>
  partsApi.update(buildId, part.id, { state: 'received', receivedOn: today(), version: part.version });
