// Stock parts taken off the vehicle, with their disposition and sale prices (sales offset cost).
import { api, qs } from './http';
import type { RemovedPartSeen as RemovedPartRecord } from '@shared/contracts/removedPart';

export type RemovedPartInput = Partial<Omit<RemovedPartRecord, 'id' | 'buildId'>>;

const base = (buildId: number) => `/api/builds/${buildId}/removed-parts`;

export const removedPartsApi = {
  list: (buildId: number, q: { upgradeId?: number } = {}) =>
    api.get<{ removedParts: RemovedPartRecord[] }>(base(buildId) + qs({ ...q })),
  create: (buildId: number, body: RemovedPartInput) =>
    api.post<{ removedPart: RemovedPartRecord }>(base(buildId), body),
  update: (buildId: number, id: number, body: RemovedPartInput) =>
    api.patch<{ removedPart: RemovedPartRecord }>(`${base(buildId)}/${id}`, body),
  remove: (buildId: number, id: number) => api.del<void>(`${base(buildId)}/${id}`),
};
