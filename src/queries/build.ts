// The build being worked on: every screen under /builds/:buildId reads it here. Which build is
// open is client state (the build store); the record itself is server data in the query cache
// under keys.buildRecord, refreshed by live notices and after a save.
import { computed, reactive } from 'vue';
import { useQueryClient } from '@tanstack/vue-query';
import { buildsApi, type BuildWithOverride } from '@/api/builds';
import { useApiQuery } from '@/composables/useApiQuery';
import { useBuildStore, vehicleLabel } from '@/stores/build';
import { invalidateBuild, keys } from './keys';

export function useCurrentBuild() {
  const store = useBuildStore();
  const client = useQueryClient();
  const q = useApiQuery(
    () => (store.buildId ? keys.buildRecord(store.buildId) : null),
    () => buildsApi.get(store.buildId!).then((r) => r.build),
    {
      fallback: 'Could not load the build.',
      byStatus: { 404: 'This build does not exist (or was deleted).' },
      staleTime: Infinity,
    },
  );
  const build = computed<BuildWithOverride | null>(() =>
    store.buildId && q.data.value?.id === store.buildId ? q.data.value : null,
  );
  return reactive({
    buildId: computed(() => store.buildId),
    build,
    loading: q.loading,
    error: q.error,
    vehicleName: computed(() => (build.value ? vehicleLabel(build.value) : '')),
    /** Opens a build (the header does, from the route). */
    load: (id: number) => store.open(id),
    /** Re-reads the open build. */
    refresh: () => (store.buildId ? invalidateBuild(client, store.buildId, 'record') : Promise.resolve()),
    /** Takes a build the server just answered with (after a save) without another request. */
    set: (b: BuildWithOverride) => {
      client.setQueryData(keys.buildRecord(b.id), b);
      store.open(b.id);
    },
  });
}
