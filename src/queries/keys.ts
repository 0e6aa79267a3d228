// The one key factory for server data held by TanStack Query. Every key of a build starts with
// ['build', id], so one invalidation (after a write, or a live notice) refreshes all of that build;
// a resource's key adds its name, then its parameters, so a narrower invalidation is possible too.
//
//   useApiQuery(() => keys.episodes(buildId.value), () => episodesApi.list(buildId.value));
//   invalidateBuild(queryClient, buildId.value);
import type { QueryClient } from '@tanstack/vue-query';

export type BuildResource =
  | 'record'
  | 'upgrades'
  | 'upgrade'
  | 'episodes'
  | 'parts'
  | 'plan'
  | 'slips'
  | 'overview'
  | 'report'
  | 'sales'
  | 'media'
  | 'publishing'
  | 'viewer-requests'
  | 'shop-floor';

export const keys = {
  /** The list of builds (the builds screen). */
  builds: () => ['builds'] as const,
  /** Everything of one build: the prefix every build key starts with. */
  build: (buildId: number) => ['build', buildId] as const,
  /** One resource of a build, with its parameters (a filter, a page, a record id). */
  of: (buildId: number, resource: BuildResource, ...params: unknown[]) =>
    ['build', buildId, resource, ...params] as const,
  /** The build's own record (vehicle, capacity, money fields). */
  buildRecord: (buildId: number) => keys.of(buildId, 'record'),
  upgrades: (buildId: number, query?: unknown) =>
    query === undefined ? keys.of(buildId, 'upgrades') : keys.of(buildId, 'upgrades', query),
  everyUpgrade: (buildId: number) => keys.of(buildId, 'upgrades', 'every'),
  upgrade: (buildId: number, upgradeId: number) => keys.of(buildId, 'upgrade', upgradeId),
  episodes: (buildId: number) => keys.of(buildId, 'episodes'),
  parts: (buildId: number, query?: unknown) =>
    query === undefined ? keys.of(buildId, 'parts') : keys.of(buildId, 'parts', query),
  viewerRequests: (buildId: number, state?: string | null) => keys.of(buildId, 'viewer-requests', state ?? 'all'),
  media: (buildId: number, query?: unknown) => keys.of(buildId, 'media', query ?? 'all'),
  /** One upgrade's history (under the upgrade, so a change to it refreshes the history too). */
  activity: (buildId: number, upgradeId: number) => [...keys.upgrade(buildId, upgradeId), 'activity'] as const,
  /** Account-wide records (people, invitations, failed mail): not tied to one build. */
  users: () => ['users'] as const,
  failedMail: () => ['users', 'failed-mail'] as const,
};

/** Marks every query of a build stale (the active ones re-fetch now); resources narrow it. */
export function invalidateBuild(client: QueryClient, buildId: number, ...resources: BuildResource[]) {
  if (!resources.length) return client.invalidateQueries({ queryKey: keys.build(buildId) });
  return Promise.all(resources.map((r) => client.invalidateQueries({ queryKey: keys.of(buildId, r) }))).then(
    () => undefined,
  );
}

/** Marks the builds list stale, and every query of one build when it is given. */
export function invalidateBuilds(client: QueryClient, buildId?: number) {
  return Promise.all([
    client.invalidateQueries({ queryKey: keys.builds() }),
    buildId ? invalidateBuild(client, buildId) : undefined,
  ]).then(() => undefined);
}
