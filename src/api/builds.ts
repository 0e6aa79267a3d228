// Builds: the list with progress and spend, one build, create, change (optimistic version) and delete.
import { api } from './http';
import type { BuildAnswer, BuildRowSeen, BuildSeen as BuildRecord } from '@shared/contracts/build';

/** A build as the list shows it: progress for everyone, spend only for roles that see money. */
export type BuildListRow = BuildRowSeen;

/** The fields a person edits; money fields are sent only by the owner. */
export type BuildInput = Partial<Omit<BuildRecord, 'id' | 'version'>> & { vinCheckOverridden?: boolean };

export type BuildWithOverride = BuildRecord;

export const buildsApi = {
  list: () => api.get<{ builds: BuildListRow[] }>('/api/builds'),
  get: (buildId: number) => api.get<BuildAnswer>(`/api/builds/${buildId}`),
  create: (body: BuildInput) => api.post<BuildAnswer>('/api/builds', body),
  update: (buildId: number, body: BuildInput & { version: number }) =>
    api.patch<BuildAnswer>(`/api/builds/${buildId}`, body),
  remove: (buildId: number) => api.del<void>(`/api/builds/${buildId}`),
};
