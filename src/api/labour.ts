// Labour entries of one build: hours by a person on an upgrade (installers log their own).
import { api, qs, type ChangeOptions } from './http';
import type { LabourAnswer, LabourEntry as LabourEntryRecord, LabourList } from '@shared/contracts/labour';

export type LabourInput = Partial<Omit<LabourEntryRecord, 'id' | 'buildId' | 'personName'>> & { personName?: string };

const base = (buildId: number) => `/api/builds/${buildId}/labour`;

export const labourApi = {
  list: (buildId: number, q: { upgradeId?: number } = {}) => api.get<LabourList>(base(buildId) + qs({ ...q })),
  create: (buildId: number, body: LabourInput, opts: ChangeOptions = {}) =>
    api.post<LabourAnswer>(base(buildId), body, opts),
  update: (buildId: number, id: number, body: LabourInput) => api.patch<LabourAnswer>(`${base(buildId)}/${id}`, body),
  remove: (buildId: number, id: number) => api.del<void>(`${base(buildId)}/${id}`),
};
