// Builds: the list with progress and spend, one build, create, change (optimistic version) and delete.
import { api } from './http';
import type { BuildRecord } from '@shared/domain';

/** A build as the list shows it: progress for everyone, spend only for roles that see money. */
export type BuildListRow = BuildRecord & { upgradesDone: number; upgradesTotal: number; spentCents?: number };

/** The fields a person edits; money fields are sent only by the owner. */
export type BuildInput = Partial<Omit<BuildRecord, 'id' | 'version'>> & { vinCheckOverridden?: boolean };

export type BuildWithOverride = BuildRecord & { vinCheckOverridden?: boolean };

export const buildsApi = {
  list: () => api.get<{ builds: BuildListRow[] }>('/api/builds'),
  get: (buildId: number) => api.get<{ build: BuildWithOverride }>(`/api/builds/${buildId}`),
  create: (body: BuildInput) => api.post<{ build: BuildWithOverride }>('/api/builds', body),
  update: (buildId: number, body: BuildInput & { version: number }) => api.patch<{ build: BuildWithOverride }>(`/api/builds/${buildId}`, body),
  remove: (buildId: number) => api.del<void>(`/api/builds/${buildId}`),
};
